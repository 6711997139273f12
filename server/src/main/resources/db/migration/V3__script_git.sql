-- What git says about a script version: who committed it last, when, and everyone who changed it
-- (people to ask about the datasets the script writes). Names only: e-mail addresses are not kept.
alter table script_state add column git_author varchar(200);
alter table script_state add column git_committed_at timestamp with time zone;
alter table script_state add column git_authors varchar(10000);
