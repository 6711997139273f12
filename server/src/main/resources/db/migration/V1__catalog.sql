create table t (id bigint primary key);
