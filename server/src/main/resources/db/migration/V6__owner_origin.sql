-- Where an ownership comes from, so that rules of different standing can be told apart: 'file' (the
-- workspace's owners file, re-read at every harvest), 'manual' (a person, through the CLI or the API;
-- it wins over file rules for that dataset) or 'declared' (any other source). 'inherited' marks an owner
-- given to a folder and so to the files beneath it.
alter table dataset_owner add column origin varchar(20) default 'declared' not null;
alter table dataset_owner add column inherited boolean default false not null;
