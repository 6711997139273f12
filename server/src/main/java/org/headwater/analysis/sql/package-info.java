/**
 * Column-level lineage of SQL scripts: which source columns each output column of a
 * {@code CREATE VIEW}, {@code CREATE TABLE ... AS}, {@code INSERT ... SELECT} or bare
 * {@code SELECT} is copied or computed from, and which columns only filter, join or group it.
 *
 * <p>This package owns splitting a script into statements, parsing them (JSqlParser), resolving
 * names against the schemas the catalog already knows ({@link org.headwater.analysis.sql.SchemaLookup})
 * and those created earlier in the same script, and the lineage records themselves. It depends
 * on nothing else in Headwater, so the store and ingestion layers can call it without cycles:
 * {@link org.headwater.analysis.sql.SqlLineageAnalyzer} is the entry point.
 */
package org.headwater.analysis.sql;
