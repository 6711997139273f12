package org.headwater.harvest;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Map;
import org.headwater.harvest.PartitionPatterns.Placement;
import org.junit.jupiter.api.Test;

class PartitionPatternsTest {

    // common practice, no source: key=value folders (as written by Hive-style partitioned writers),
    // date-named folders and files, part-NNNNN files.
    @Test
    void keyValueFoldersBecomeKeys() {
        assertThat(PartitionPatterns.place("stations/readings/year=2025/month=01/readings.csv")).contains(
                new Placement("stations/readings/year=*/month=*/readings.csv", Map.of("year", "2025", "month", "01")));
    }

    @Test
    void datesAndYearsAtTheEndOfANameBecomeADateKey() {
        assertThat(PartitionPatterns.place("field/sampling_visits_2025-03.json")).contains(
                new Placement("field/sampling_visits_*.json", Map.of("date", "2025-03")));
        assertThat(PartitionPatterns.place("exports/flows_2021.csv")).contains(
                new Placement("exports/flows_*.csv", Map.of("date", "2021")));
        assertThat(PartitionPatterns.place("exports/flows20210131.csv")).contains(
                new Placement("exports/flows*.csv", Map.of("date", "20210131")));
    }

    @Test
    void partFilesAndDateFoldersBecomeKeys() {
        assertThat(PartitionPatterns.place("out/2025-02-01/part-00003-3f2a.snappy.parquet")).contains(
                new Placement("out/*/part-*.snappy.parquet", Map.of("date", "2025-02-01", "part", "00003")));
        assertThat(PartitionPatterns.place("logs/2025/07/events.ndjson")).contains(
                new Placement("logs/*/*/events.ndjson", Map.of("folder", "2025", "folder_2", "07")));
    }

    @Test
    void figuresScriptsAndPlainNamesAreNeverPartitions() {
        assertThat(PartitionPatterns.place("bulletin/figures/fig_2025.png")).isEmpty();
        assertThat(PartitionPatterns.place("scripts/clean_2025.py")).isEmpty();
        assertThat(PartitionPatterns.place("stations/station_register.csv")).isEmpty();
    }
}
