/**
 * The catalog's storage: opening the database (embedded H2 by default, or PostgreSQL as a team store;
 * {@link org.headwater.store.StoreDialect}), running the Flyway migrations, handing out the jOOQ context,
 * the writer lock and work claims that let several processes share one store; plus the read-side queries the API, CLI and index use. All SQL is
 * written with jOOQ against classes generated from the migrations. Writes happen only in
 * {@link org.headwater.ingest}.
 */
package org.headwater.store;
