/**
 * Harvests relational databases over JDBC: schemas, tables, views, columns, keys, row-count estimates
 * from the database's own statistics, and view definitions, which go through the SQL column-lineage
 * analyzer. Owns the per-dialect catalog queries ({@link org.headwater.harvest.jdbc.Dialect}) and the
 * {@code db:SOURCE/SCHEMA.TABLE} URIs. Reads only metadata, never cell values; writes nothing itself.
 */
package org.headwater.harvest.jdbc;
