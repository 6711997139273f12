-- Quillwater basin monitoring: reporting schema (PostgreSQL dialect).
-- station      <- stations/station_register.csv
-- station_reading <- stations/readings/year=2025/month=MM/readings.csv
-- lab_result   <- derived/lab_merged.csv

CREATE TABLE station (
    station_code  VARCHAR(8)    PRIMARY KEY,
    station_name  VARCHAR(80)   NOT NULL,
    river_km      NUMERIC(5, 1) NOT NULL,
    lat           NUMERIC(8, 4),
    lon           NUMERIC(8, 4),
    opened_on     DATE
);

CREATE TABLE station_reading (
    station_code           VARCHAR(8)    NOT NULL REFERENCES station (station_code),
    reading_date           DATE          NOT NULL,
    water_temp_c           NUMERIC(4, 1),
    ph                     NUMERIC(4, 2),
    dissolved_oxygen_mg_l  NUMERIC(4, 1),
    nitrate_mg_l           NUMERIC(5, 2),
    turbidity_ntu          NUMERIC(5, 1),
    flow_m3_s              NUMERIC(6, 2),
    PRIMARY KEY (station_code, reading_date)
);

CREATE TABLE lab_result (
    sample_id           VARCHAR(16)   PRIMARY KEY,
    station_code        VARCHAR(8)    NOT NULL REFERENCES station (station_code),
    sampled_on          DATE          NOT NULL,
    nitrate_mg_l        NUMERIC(5, 2),
    nitrite_mg_l        NUMERIC(5, 3),
    chloride_mg_l       NUMERIC(6, 2),
    sulfate_mg_l        NUMERIC(6, 2),
    phosphate_mg_l      NUMERIC(5, 3),
    turbidity_ntu       NUMERIC(5, 1),
    conductivity_us_cm  NUMERIC(6, 1)
);

CREATE VIEW monthly_station_summary AS
SELECT
    s.station_code,
    s.station_name,
    s.river_km,
    CAST(EXTRACT(MONTH FROM r.reading_date) AS INTEGER) AS month,
    ROUND(AVG(r.water_temp_c), 2)          AS mean_temp_c,
    ROUND(AVG(r.ph), 2)                    AS mean_ph,
    ROUND(AVG(r.dissolved_oxygen_mg_l), 2) AS mean_do_mg_l,
    ROUND(AVG(r.nitrate_mg_l), 2)          AS mean_nitrate_mg_l,
    COUNT(*)                               AS n_readings
FROM station_reading r
JOIN station s ON s.station_code = r.station_code
GROUP BY s.station_code, s.station_name, s.river_km, CAST(EXTRACT(MONTH FROM r.reading_date) AS INTEGER);

CREATE VIEW lab_exceedance AS
SELECT
    l.sample_id,
    l.station_code,
    s.station_name,
    l.sampled_on,
    l.nitrate_mg_l,
    l.phosphate_mg_l
FROM lab_result l
JOIN station s ON s.station_code = l.station_code
WHERE l.nitrate_mg_l > 10.0 OR l.phosphate_mg_l > 0.25;
