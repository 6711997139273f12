-- An invented community seed library: varieties, donated packets, members' loans, germination tests.
-- Written to run unchanged on PostgreSQL 15 and H2 2.x; statements end with ';' at the end of a line.
create schema seeds;

create table seeds.variety (
    variety_id integer primary key,
    common_name varchar(80) not null,
    genus varchar(40) not null,
    days_to_harvest integer,
    heirloom boolean not null default false
);
comment on table seeds.variety is 'Seed varieties the library keeps';
comment on column seeds.variety.days_to_harvest is 'Typical days from sowing to first harvest';

create table seeds.member (
    member_id integer primary key,
    joined_on date not null,
    plot_zone varchar(10)
);

create table seeds.packet (
    packet_id integer primary key,
    variety_id integer not null references seeds.variety (variety_id),
    harvested_year integer not null,
    grams numeric(8, 2) not null,
    donated_by integer references seeds.member (member_id)
);

create table seeds.loan (
    loan_id bigint generated always as identity primary key,
    packet_id integer not null references seeds.packet (packet_id),
    member_id integer not null references seeds.member (member_id),
    lent_on date not null,
    returned_grams numeric(8, 2)
);

create table seeds.germination_test (
    packet_id integer not null,
    tested_on date not null,
    sown integer not null,
    sprouted integer not null,
    primary key (packet_id, tested_on),
    constraint germination_of_packet foreign key (packet_id) references seeds.packet (packet_id)
);

-- A join with a filter.
create view seeds.packet_catalog as
select p.packet_id, v.common_name, v.genus, p.harvested_year, p.grams
from seeds.packet p join seeds.variety v on v.variety_id = p.variety_id
where v.heirloom;

-- Aggregates over a USING join, with HAVING.
create view seeds.grams_by_genus as
select v.genus, sum(p.grams) as total_grams, count(*) as packets
from seeds.packet p join seeds.variety v using (variety_id)
group by v.genus
having count(*) > 1;

-- A CTE joined back to its table.
create view seeds.germination_rate as
with latest as (
    select packet_id, max(tested_on) as tested_on from seeds.germination_test group by packet_id
)
select g.packet_id, g.tested_on, round(100.0 * g.sprouted / g.sown, 1) as rate_pct
from seeds.germination_test g join latest l on l.packet_id = g.packet_id and l.tested_on = g.tested_on;

-- A scalar subquery, an EXISTS subquery and a CASE.
create view seeds.active_members as
select m.member_id,
       case when m.plot_zone is null then 'none' else m.plot_zone end as zone,
       (select count(*) from seeds.loan l where l.member_id = m.member_id) as loans
from seeds.member m
where exists (select 1 from seeds.loan l2 where l2.member_id = m.member_id and l2.returned_grams is null);

-- A derived table.
create view seeds.yearly_stock as
select y.harvested_year, y.grams
from (select harvested_year, sum(grams) as grams from seeds.packet group by harvested_year) y
where y.grams > 0;

-- A view over two views.
create view seeds.heirloom_stock as
select c.genus, c.common_name, c.grams, r.rate_pct
from seeds.packet_catalog c left join seeds.germination_rate r on r.packet_id = c.packet_id;

-- A view over views over views, grouped.
create view seeds.genus_summary as
select h.genus, count(*) as varieties, avg(h.rate_pct) as mean_rate, g.total_grams
from seeds.heirloom_stock h join seeds.grams_by_genus g on g.genus = h.genus
group by h.genus, g.total_grams;

-- A UNION ALL of two tables.
create view seeds.member_dates as
select member_id as id, joined_on as on_date from seeds.member
union all
select loan_id, lent_on from seeds.loan;

insert into seeds.variety values (1, 'Speckled runner bean', 'Phaseolus', 90, true);
insert into seeds.variety values (2, 'Amber sweetcorn', 'Zea', 85, false);
insert into seeds.variety values (3, 'Moss-curled parsley', 'Petroselinum', 75, true);
insert into seeds.variety values (4, 'Violet pole bean', 'Phaseolus', 70, true);
insert into seeds.member values (101, date '2024-03-02', 'north');
insert into seeds.member values (102, date '2024-05-19', null);
insert into seeds.member values (103, date '2025-01-07', 'river');
insert into seeds.packet values (11, 1, 2024, 40.00, 101);
insert into seeds.packet values (12, 1, 2025, 35.50, 103);
insert into seeds.packet values (13, 2, 2025, 120.00, null);
insert into seeds.packet values (14, 3, 2024, 8.25, 102);
insert into seeds.packet values (15, 4, 2025, 22.00, 101);
insert into seeds.loan (packet_id, member_id, lent_on, returned_grams) values (11, 102, date '2025-04-01', 60.00);
insert into seeds.loan (packet_id, member_id, lent_on, returned_grams) values (13, 103, date '2025-04-12', null);
insert into seeds.loan (packet_id, member_id, lent_on, returned_grams) values (14, 101, date '2025-05-03', null);
insert into seeds.germination_test values (11, date '2025-02-01', 20, 17);
insert into seeds.germination_test values (11, date '2025-09-01', 20, 14);
insert into seeds.germination_test values (14, date '2025-02-15', 50, 31);
