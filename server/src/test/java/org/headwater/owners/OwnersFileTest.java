package org.headwater.owners;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

/**
 * The owners file's syntax and precedence. Glob semantics are those documented for
 * {@code java.nio.file.FileSystem#getPathMatcher} (Java 17 API): "{@code *}" matches zero or more
 * characters of a name component without crossing directory boundaries, "{@code **}" crosses them,
 * "{@code ?}" matches exactly one character, "{@code [ ]}" a bracket expression, "{@code { }}" a group of
 * subpatterns, and a leading period in a name is a regular character.
 */
class OwnersFileTest {

    private static String owners(OwnersFile file, String name) {
        Optional<OwnersFile.Match> match = file.match(name);
        return match.map(m -> m.rule().owners().stream().map(o -> o.kind() + ":" + o.name()).toList()
                + " line " + m.rule().line() + (m.inherited() ? " via " + m.matched() : "")).orElse("none");
    }

    @Test
    void starStaysWithinOneFolderAndDoubleStarCrossesFolders() {
        OwnersFile file = OwnersFile.parse(List.of("raw/*.csv  Ada", "logs/**  Bo"));
        // expected: FileSystem.getPathMatcher, "*" does not cross directory boundaries
        assertThat(owners(file, "raw/a.csv")).isEqualTo("[person:Ada] line 1");
        assertThat(owners(file, "raw/deep/a.csv")).isEqualTo("none");
        // expected: FileSystem.getPathMatcher, "**" crosses directory boundaries
        assertThat(owners(file, "logs/2026/03/day.txt")).isEqualTo("[person:Bo] line 2");
        // expected: "**" after "logs/" needs the separator, so the folder name alone does not match
        assertThat(owners(file, "logs")).isEqualTo("none");
    }

    @Test
    void questionMarksBracketsAndGroupsFollowTheDocumentedGlobRules() {
        OwnersFile file = OwnersFile.parse(List.of("q?.csv Ada", "part-[0-9].csv Bo", "{north,south}/*.json Cy"));
        // expected: FileSystem.getPathMatcher, "?" matches exactly one character
        assertThat(owners(file, "q1.csv")).isEqualTo("[person:Ada] line 1");
        assertThat(owners(file, "q12.csv")).isEqualTo("none");
        // expected: FileSystem.getPathMatcher, "[0-9]" is a range in a bracket expression
        assertThat(owners(file, "part-7.csv")).isEqualTo("[person:Bo] line 2");
        assertThat(owners(file, "part-x.csv")).isEqualTo("none");
        // expected: FileSystem.getPathMatcher, "{north,south}" matches either subpattern
        assertThat(owners(file, "south/a.json")).isEqualTo("[person:Cy] line 3");
        assertThat(owners(file, "east/a.json")).isEqualTo("none");
    }

    @Test
    void aFolderGivesItsOwnersToEverythingBeneathAsInherited() {
        OwnersFile file = OwnersFile.parse(List.of("raw/  team:field crew", "work  Bo"));
        assertThat(owners(file, "raw/loggers/2026/a.csv")).isEqualTo("[team:field crew] line 1 via raw");
        assertThat(owners(file, "work/a.csv")).isEqualTo("[person:Bo] line 2 via work");
        // A pattern ending in / names folders only: a file called raw is not matched by line 1.
        assertThat(owners(file, "raw")).isEqualTo("none");
        assertThat(file.match("raw/loggers/2026/a.csv").orElseThrow().reason())
                .isEqualTo("headwater.owners line 1: raw/ (folder raw)");
    }

    @Test
    void theMoreSpecificLineWinsAndBetweenEquallySpecificLinesTheLaterOne() {
        OwnersFile file = OwnersFile.parse(List.of(
                "raw/loggers/*.csv  Ada",      // two literal parts
                "raw/**             Bo",       // one literal part, later, but less specific
                "raw/loggers/       Cy",       // two literal parts, later than line 1: wins the tie
                "raw/loggers/x.csv  Di, team:night shift",   // three literal parts
                "**/old.csv         nobody",   // one literal part: less specific than line 3
                "*/loggers/new.csv  Ed"));     // two literal parts, as line 3, and later: wins
        assertThat(owners(file, "raw/loggers/a.csv")).isEqualTo("[person:Cy] line 3 via raw/loggers");
        assertThat(owners(file, "raw/loggers/x.csv")).isEqualTo("[person:Di, team:night shift] line 4");
        assertThat(owners(file, "raw/other/a.csv")).isEqualTo("[person:Bo] line 2");
        assertThat(owners(file, "raw/loggers/old.csv")).isEqualTo("[person:Cy] line 3 via raw/loggers");
        assertThat(owners(file, "raw/loggers/new.csv")).isEqualTo("[person:Ed] line 6");
        OwnersFile clearing = OwnersFile.parse(List.of("raw/** Bo", "raw/scratch/** nobody"));
        assertThat(owners(clearing, "raw/scratch/tmp.csv")).isEqualTo("[] line 2");
    }

    @Test
    void commentsBlankLinesAndALeadingSlashAreAllowed() {
        OwnersFile file = OwnersFile.parse(List.of("# who answers for what", "", "   ",
                "/figures/*.png  Tamsin Reed, team:newsletter   # the bulletin", "  # indented comment"));
        assertThat(file.problems()).isEmpty();
        assertThat(file.rules()).hasSize(1);
        assertThat(owners(file, "figures/a.png")).isEqualTo("[person:Tamsin Reed, team:newsletter] line 4");
    }

    @Test
    void badLinesAreReportedWithTheirNumberAndTheOtherLinesStillCount() {
        OwnersFile file = OwnersFile.parse(List.of("raw/[a-.csv  Ada", "work/**", "figures/** team:", "ok/** Bo"));
        assertThat(file.problems()).extracting(OwnersFile.Problem::toString).containsExactly(
                "headwater.owners line 1: 'raw/[a-.csv' is not a valid glob: Invalid range",
                "headwater.owners line 2: 'work/**' has no owner; write 'nobody' to clear owners",
                "headwater.owners line 3: an empty owner name in 'team:'");
        assertThat(owners(file, "ok/a.csv")).isEqualTo("[person:Bo] line 4");
    }
}
