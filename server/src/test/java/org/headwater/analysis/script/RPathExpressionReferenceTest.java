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
 * R path expressions evaluated by Headwater without running them, against R evaluating the same
 * expressions. // reference: R 4 (Rscript on the machine): file.path, paste, paste0, sprintf,
 * dirname, basename, ifelse, vector indexing
 */
class RPathExpressionReferenceTest {
    private static final String PRELUDE = String.join("\n", "RAW <- \"raw\"", "N <- 7", "YEAR <- 2024L", "parts <- c(\"a\", \"b\", \"c\")", "");
    private static final List<String> EXPRESSIONS = List.of(
            "file.path(RAW, \"x\", \"y.csv\")",
            "file.path(RAW, paste0(\"s_\", N, \".csv\"))",
            "paste(RAW, \"part\", YEAR, sep = \"/\")",
            "paste(\"raw/a\", \"b.csv\")",
            "paste0(RAW, \"/\", YEAR, \"_\", N * 2, \".rds\")",
            "sprintf(\"%s/%04d/m%02d.csv\", RAW, YEAR, 3L)",
            "sprintf(\"%s/v%.1f.csv\", RAW, 2.25)",
            "sprintf(\"raw/%5s.csv\", \"ab\")",
            "dirname(\"raw/a/b.csv\")",
            "basename(\"raw/a/b.csv\")",
            "file.path(dirname(file.path(RAW, \"q\", \"z.csv\")), \"w.csv\")",
            "file.path(RAW, parts[2])",
            "paste0(RAW, \"/\", parts[[3]], \".csv\")",
            "if (N > 5) file.path(RAW, \"big.csv\") else file.path(RAW, \"small.csv\")",
            "ifelse(TRUE, \"raw/yes.csv\", \"raw/no.csv\")",
            "file.path(\"raw\", 3 + 4, \"seven.csv\")",
            "paste0(\"raw/\", 10 / 4, \".csv\")");

    @Test
    void headwaterResolvesPathExpressionsAsREvaluatesThem(@TempDir Path ws) throws Exception {
        External.need(External.onPath("Rscript"), "Rscript");
        StringBuilder script = new StringBuilder(PRELUDE);
        StringBuilder printer = new StringBuilder(PRELUDE);
        for (String e : EXPRESSIONS) {
            script.append("readRDS(").append(e).append(")\n");
            printer.append("cat(").append(e).append(", \"\\n\", sep = \"\")\n");
        }
        Files.writeString(ws.resolve("paths.R"), script.toString());
        Files.writeString(ws.resolve("printer.R"), printer.toString());
        List<String> r = List.of(External.run(ws, List.of("Rscript", "printer.R"), Map.of()).strip().split("\n"));

        ScriptAnalysis a = new ScriptAnalyzer().analyze(ws, Path.of("paths.R"), AnalysisContext.defaults());
        List<String> headwater = new ArrayList<>();
        for (DataReference ref : a.references()) {
            headwater.add(ref.resolved() ? ref.pathPattern() : "unresolved: " + ref.expressionText());
        }
        assertThat(headwater).containsExactlyElementsOf(r);
    }
}
