-- A run names its script by path even when no harvest has seen that script, and says which connector
-- sent it. Runtime data frames report their columns, kept with the input or output they belong to.
alter table run add column script_uri varchar(2000);
alter table run add column client varchar(100);
alter table run_io add column columns_json varchar(100000);
alter table run_io add column row_count bigint;
create index run_io_by_hash on run_io (content_hash);
