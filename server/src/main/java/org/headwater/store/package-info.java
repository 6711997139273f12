/**
 * The catalog's storage: opening the database (embedded H2 by default), running the Flyway migrations
 * and handing out the jOOQ context; plus the read-side queries the API, CLI and index use. All SQL is
 * written with jOOQ against classes generated from the migrations. Writes happen only in
 * {@link org.headwater.ingest}.
 */
package org.headwater.store;
