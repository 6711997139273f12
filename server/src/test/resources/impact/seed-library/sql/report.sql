-- The newsletter's rate table; volunteers load variety_rate by hand from work/rates.csv and tick
-- checked once a second volunteer has compared it with the tray sheets.
CREATE TABLE variety_rate (
    variety_name  VARCHAR(80)  NOT NULL,
    mean_rate     DOUBLE PRECISION,
    checked       BOOLEAN      NOT NULL
);

CREATE VIEW rate_report AS
SELECT variety_name, ROUND(mean_rate * 100) AS rate_percent
FROM variety_rate
WHERE checked;
