-- Nothing to change on PostgreSQL; this version exists so that both stores carry the same migration
-- versions. On H2 it gives identity columns blocks of 10,000 values (db/h2). PostgreSQL keeps one
-- value per draw: its cached values belong to one connection, and the change log's numbers must follow
-- the order in which batches commit, whichever pooled connection applies them.
select 1;
