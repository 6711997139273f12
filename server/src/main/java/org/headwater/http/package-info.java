/**
 * The HTTP server: the JSON API under {@code /api} and the web assets at {@code /}, on Javalin. Handlers
 * translate requests into catalog reads and observations; they hold no catalog logic of their own.
 */
package org.headwater.http;
