-- A schema version can come from a table format's own history (a Delta commit, an Iceberg snapshot or
-- schema) rather than from a harvest noticing new columns. Such rows say which table version they are, when
-- the table recorded it (its own clock, not the catalog's: valid_from stays the catalog's time), the
-- operation the table wrote down, and the partition columns then in force (a JSON array).
alter table schema_version add column table_version varchar(100);
alter table schema_version add column recorded_at timestamp with time zone;
alter table schema_version add column operation varchar(200);
alter table schema_version add column partition_columns varchar(4000);
