package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * R's sprintf is C's printf over vectors; the shell's printf is the same C family, so it is the
 * reference for the formats Headwater evaluates in R paths (R itself is not on the machine).
 * // reference: GNU bash printf builtin (C printf conversions d, s, f with flags, width, precision)
 */
class RSprintfPrintfReferenceTest {
    private record Case(String format, String arg) {
    }

    private static final List<Case> CASES = List.of(
            new Case("raw/frame_%02d.csv", "3"),
            new Case("raw/frame_%03d.csv", "42"),
            new Case("raw/%s_x.csv", "north"),
            new Case("raw/%5s.csv", "ab"),
            new Case("raw/%-5s.csv", "ab"),
            new Case("raw/v%.2f.csv", "2.345"),
            new Case("raw/v%.0f.csv", "2.5"),
            new Case("raw/v%.1f.csv", "0.25"),
            new Case("raw/%d%%.csv", "50"));

    @Test
    void sprintfPathsMatchPrintf(@TempDir Path ws) throws Exception {
        External.need(External.onPath("bash"), "bash");
        StringBuilder r = new StringBuilder("library(readr)\n");
        List<String> expected = new ArrayList<>();
        for (Case c : CASES) {
            boolean number = c.arg().matches("[0-9.]+");
            r.append("read_csv(sprintf(\"").append(c.format()).append("\", ").append(number ? c.arg() : "\"" + c.arg() + "\"").append("))\n");
            expected.add(External.run(ws, List.of("bash", "-c", "printf \"$0\" \"$1\"", c.format(), c.arg()), Map.of()));
        }
        Files.writeString(ws.resolve("paths.R"), r.toString());
        ScriptAnalysis a = new ScriptAnalyzer().analyze(ws, Path.of("paths.R"), AnalysisContext.defaults());
        assertThat(a.references()).extracting(DataReference::pathPattern).containsExactlyElementsOf(expected);
    }
}
