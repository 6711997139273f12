-- H2 only. H2 keeps an identity column's next value in its metadata and rewrites it, in a commit of its
-- own, each time the values it handed out in advance run out: 32 by default. A harvest inserts about two
-- rows per file (the partition and its change-log entry), so a 50,000-file harvest made some 3,000 such
-- metadata commits, a fifth of the time spent applying it. Blocks of 10,000 make that a handful. Values
-- handed out but unused when the process dies are skipped, never reused: ids stay unique and increasing,
-- with gaps, which nothing relies on (rolled-back inserts leave gaps already).
-- PostgreSQL keeps its default (no cache): a cached block there belongs to one connection, so two
-- connections would draw change-log numbers out of commit order (see db/postgresql).
alter table api_token alter column id set cache 10000;
alter table audit_event alter column id set cache 10000;
alter table source alter column id set cache 10000;
alter table harvest alter column id set cache 10000;
alter table harvest_error alter column id set cache 10000;
alter table dataset alter column id set cache 10000;
alter table dataset_state alter column id set cache 10000;
alter table schema_version alter column id set cache 10000;
alter table schema_column alter column id set cache 10000;
alter table dataset_note alter column id set cache 10000;
alter table script alter column id set cache 10000;
alter table script_state alter column id set cache 10000;
alter table run_io alter column id set cache 10000;
alter table lineage_edge alter column id set cache 10000;
alter table column_lineage alter column id set cache 10000;
alter table owner alter column id set cache 10000;
alter table dataset_owner alter column id set cache 10000;
alter table change_log alter column seq set cache 10000;
alter table dataset_partition alter column id set cache 10000;
alter table script_analysis alter column id set cache 10000;
alter table script_reference alter column id set cache 10000;
alter table freshness_policy alter column id set cache 10000;
alter table freshness_check alter column id set cache 10000;
