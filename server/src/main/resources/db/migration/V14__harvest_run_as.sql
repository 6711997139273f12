-- The name a sources file gave the source a harvest ran as. Two entries of a sources file may name the
-- same root (the same bucket with other credentials, say); the root stays one source, but each harvest
-- record must say which entry ran it, or one entry's failure reads as the other's.
alter table harvest add column run_as varchar(200);
