-- Ovenmere cooperative: the shared order ledger (PostgreSQL dialect).
-- bakery        <- members/member_bakeries.csv
-- shop_order    <- orders/wholesale_orders_2026.csv
-- delivery_run  <- deliveries/delivery_runs.ndjson

CREATE TABLE bakery (
    bakery_code   VARCHAR(8)   PRIMARY KEY,
    bakery_name   VARCHAR(80)  NOT NULL,
    district      VARCHAR(40),
    joined_on     DATE
);

CREATE TABLE shop_order (
    order_id          VARCHAR(12)  PRIMARY KEY,
    bakery_code       VARCHAR(8)   NOT NULL REFERENCES bakery (bakery_code),
    shop_code         VARCHAR(8)   NOT NULL,
    recipe_code       VARCHAR(8)   NOT NULL,
    order_date        DATE         NOT NULL,
    due_date          DATE         NOT NULL,
    loaves            INTEGER      NOT NULL,
    unit_price_cents  INTEGER      NOT NULL
);

CREATE TABLE delivery_run (
    run_id       VARCHAR(8)   PRIMARY KEY,
    route_code   VARCHAR(8)   NOT NULL,
    run_date     DATE         NOT NULL,
    departed_at  TIMESTAMP    NOT NULL,
    returned_at  TIMESTAMP,
    crates_out   INTEGER,
    crates_back  INTEGER,
    late_stops   INTEGER
);

CREATE VIEW bakery_order_totals AS
SELECT
    b.bakery_code,
    b.bakery_name,
    COUNT(*)                                  AS orders,
    SUM(o.loaves)                             AS loaves,
    SUM(o.loaves * o.unit_price_cents)        AS revenue_cents
FROM shop_order o
JOIN bakery b ON b.bakery_code = o.bakery_code
GROUP BY b.bakery_code, b.bakery_name;

CREATE VIEW late_delivery AS
SELECT
    r.run_id,
    r.route_code,
    r.run_date,
    r.late_stops,
    r.crates_back
FROM delivery_run r
WHERE r.late_stops > 0;
