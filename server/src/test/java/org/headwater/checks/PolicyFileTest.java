package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class PolicyFileTest {
    private static final PolicyFile FILE = PolicyFile.parse("""
            # hive cooperative: how fresh each folder should be
            hives/**                    max-age 36h
            hives/scale_*.csv           schedule 0 6 * * *
            hives/**                    max-age 2d
            hives/scale_north.csv       none
            reports/                    schedule 0 7 * * 1 grace 3h
            *.csv                       max-age 7d
            """);

    @Test
    void theMostSpecificMatchingRuleWinsAndAtEqualSpecificityTheLaterLine() {
        // expected: the file syntax documented in README "Freshness policy file" (our own rules).
        assertThat(FILE.ruleFor("hives/feed_log.csv").orElseThrow().line()).isEqualTo(4);
        assertThat(FILE.ruleFor("hives/feed_log.csv").orElseThrow().policy().orElseThrow().text()).isEqualTo("max-age 2d");
        assertThat(FILE.ruleFor("hives/scale_east.csv").orElseThrow().line()).isEqualTo(3);
        assertThat(FILE.ruleFor("hives/scale_north.csv").orElseThrow().policy()).isEmpty();
        assertThat(FILE.ruleFor("reports/2026/weekly.csv").orElseThrow().line()).isEqualTo(6);
        assertThat(FILE.ruleFor("apiaries.csv").orElseThrow().line()).isEqualTo(7);
        assertThat(FILE.ruleFor("notes/visits.json")).isEmpty();
    }

    @Test
    void aSingleStarStaysWithinOneFolderAndADoubleStarCrossesFolders() {
        // expected: java.nio.file.FileSystem#getPathMatcher glob rules (JDK API documentation).
        assertThat(FILE.ruleFor("reference/apiaries.csv")).isEmpty();
        assertThat(FILE.ruleFor("hives/2026/11/weights.csv").orElseThrow().line()).isEqualTo(4);
    }

    @Test
    void badLinesAreReportedWithTheirNumbersAndTheOtherLinesStillCount() {
        PolicyFile file = PolicyFile.parse("""
                hives/**   max-age 36h
                hives/*.csv
                reports/** schedule 0 61 * * *
                [broken    max-age 1d
                reports/** max-age 3d
                """);

        assertThat(file.problems()).extracting(PolicyFile.Problem::line).containsExactly(2, 3, 4);
        assertThat(file.problems().get(0).message()).isEqualTo("a rule is a glob and a policy ('max-age 36h',"
                + " 'schedule 0 6 * * *' or 'none'), got only 'hives/*.csv'");
        assertThat(file.problems().get(1).message()).startsWith("'0 61 * * *' is not a crontab schedule");
        assertThat(file.problems().get(2).message()).startsWith("'[broken' is not a glob");
        assertThat(file.rules()).extracting(PolicyFile.Rule::line).containsExactly(1, 5);
    }
}
