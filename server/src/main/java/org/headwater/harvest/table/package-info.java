/**
 * Open table formats kept as files: a Delta Lake transaction log ({@code _delta_log/}) or Apache Iceberg
 * table metadata ({@code metadata/*.metadata.json}) turns a folder of data files into one table, with its
 * schema, versions and partition columns read from the format's own metadata.
 */
package org.headwater.harvest.table;
