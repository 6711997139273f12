/**
 * Who may do what: API tokens (kept hashed), their roles, and the audit log of edits and token use.
 * The HTTP layer asks this package; it never reads the token or audit tables itself.
 */
package org.headwater.access;
