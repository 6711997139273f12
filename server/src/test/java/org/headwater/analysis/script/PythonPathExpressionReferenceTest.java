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
 * Path expressions evaluated by Headwater without running them, against Python evaluating the same
 * expressions: f-strings with format specs, str.format, the % operator, os.path and pathlib.
 * // reference: CPython 3 (python3 on the machine), os.path.normpath of each expression's value
 */
class PythonPathExpressionReferenceTest {
    private static final String PRELUDE = String.join("\n",
            "import os", "from pathlib import Path", "import pandas as pd",
            "RAW = \"raw\"", "N = 7", "YEAR = 2024", "");
    private static final List<String> EXPRESSIONS = List.of(
            "f\"{RAW}/sensor_{N:03d}.csv\"",
            "\"{}/y{:04d}/m{:02d}.csv\".format(RAW, YEAR, 3)",
            "\"{name}/{n:x}.bin\".format(name=RAW, n=255)",
            "\"{0}/{0}_{1}.csv\".format(RAW, \"v\")",
            "\"%s/part-%05d.parquet\" % (RAW, N)",
            "\"%s_%s.csv\" % (\"a\", 1.5)",
            "\"%-6s|.txt\" % RAW",
            "os.path.join(RAW, \"x\", \"y.csv\")",
            "os.path.join(RAW, \"/abs/z.csv\")",
            "os.path.join(RAW, \"a/\", \"b.csv\")",
            "str(Path(RAW) / \"sub\" / \"f.txt\")",
            "str(Path(RAW).joinpath(\"j\", \"k.txt\"))",
            "os.path.dirname(os.path.join(RAW, \"a\", \"b.csv\")) + \"/c.csv\"",
            "os.path.basename(\"raw/a/b.csv\")",
            "str(Path(\"raw/a.tar.gz\").with_suffix(\".zip\"))",
            "str(Path(\"raw/a/b.csv\").parent / \"c.csv\")",
            "f\"{RAW!s}/{'q'}{YEAR}.csv\"",
            "f\"{RAW:>5}.csv\"",
            "f\"{'x':*^7}.csv\"",
            "f\"{-5:04d}.csv\"",
            "f\"{YEAR / 8}.csv\"",
            "f\"{N * 2 + 1}.csv\"",
            "f\"{2.5:.0f}_{0.125:.2f}_{3.14159:.3f}.csv\"",
            "RAW + \"/\" + str(YEAR) + \".csv\"",
            "\"_\".join([\"a\", RAW, str(N)]) + \".csv\"",
            "\"raw/Mixed.CSV\".lower()",
            "\"  raw/t.csv \".strip()",
            "\"raw/a-b.csv\".replace(\"-\", \"_\")",
            "os.path.join(RAW, \"..\", \"up.csv\")",
            "f\"{RAW}/{'{:02d}'.format(4)}.csv\"");

    @Test
    void headwaterResolvesPathExpressionsAsPythonEvaluatesThem(@TempDir Path ws) throws Exception {
        External.need(External.onPath("python3"), "python3");
        StringBuilder script = new StringBuilder(PRELUDE);
        StringBuilder printer = new StringBuilder(PRELUDE.replace("import pandas as pd\n", ""));
        for (String e : EXPRESSIONS) {
            script.append("pd.read_csv(").append(e).append(")\n");
            printer.append("print(os.path.normpath(").append(e).append("))\n");
        }
        Files.writeString(ws.resolve("paths.py"), script.toString());
        Files.writeString(ws.resolve("printer.py"), printer.toString());
        List<String> python = List.of(External.run(ws, List.of("python3", "printer.py"), Map.of()).strip().split("\n"));

        ScriptAnalysis a = new ScriptAnalyzer().analyze(ws, Path.of("paths.py"), AnalysisContext.defaults());
        List<String> headwater = new ArrayList<>();
        for (DataReference r : a.references()) {
            headwater.add(r.resolved() ? r.pathPattern() : "unresolved: " + r.expressionText());
        }
        List<String> expected = new ArrayList<>();
        for (String p : python) {
            expected.add(p.equals("..") || p.startsWith("../") ? ws.toAbsolutePath().getParent().resolve(p).normalize().toString() : p);
        }
        assertThat(headwater).containsExactlyElementsOf(expected);
    }
}
