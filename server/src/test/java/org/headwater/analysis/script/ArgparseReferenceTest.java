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
 * The values argparse gives a script for a driver's command line, as Headwater reads them from the
 * declarations, against Python's argparse parsing the same command line.
 * // reference: CPython 3 argparse (python3 on the machine)
 */
class ArgparseReferenceTest {
    private static final String DECLARATIONS = String.join("\n",
            "import argparse",
            "import pandas as pd",
            "p = argparse.ArgumentParser()",
            "p.add_argument(\"src\")",
            "p.add_argument(\"--out\", default=\"out.csv\")",
            "p.add_argument(\"--months\", nargs=\"+\", type=int, default=[1, 2])",
            "p.add_argument(\"--tag\", dest=\"label\", default=\"none\")",
            "p.add_argument(\"--dry-run\", action=\"store_true\")",
            "p.add_argument(\"-l\", \"--level\", type=int, default=3)",
            "");
    private static final List<List<String>> COMMAND_LINES = List.of(
            List.of("in.csv"),
            List.of("in.csv", "--out", "o.csv", "--months", "4", "5", "--tag=x"),
            List.of("--months", "7", "8", "9", "--dry-run", "first.csv"),
            List.of("in.csv", "-l", "9", "--out=deep/o.csv"));

    @Test
    void namespaceValuesMatchPythonArgparse(@TempDir Path ws) throws Exception {
        External.need(External.onPath("python3"), "python3");
        Files.writeString(ws.resolve("job.py"), DECLARATIONS + String.join("\n",
                "args = p.parse_args()",
                "pd.read_csv(args.src)",
                "pd.read_csv(args.out)",
                "for m in args.months:",
                "    pd.read_csv(f\"m/{m:02d}.csv\")",
                "pd.read_csv(f\"{args.label}/{args.dry_run}/{args.level}.csv\")",
                ""));
        Files.writeString(ws.resolve("printer.py"), DECLARATIONS.replace("import pandas as pd\n", "") + String.join("\n",
                "import sys",
                "args = p.parse_args(sys.argv[1:])",
                "print(args.src)",
                "print(args.out)",
                "print(','.join(f\"m/{m:02d}.csv\" for m in args.months))",
                "print(f\"{args.label}/{args.dry_run}/{args.level}.csv\")",
                ""));
        for (List<String> argv : COMMAND_LINES) {
            List<String> cmd = new ArrayList<>(List.of("python3", "printer.py"));
            cmd.addAll(argv);
            List<String> python = List.of(External.run(ws, cmd, Map.of()).strip().split("\n"));

            ScriptInvocation run = new ScriptInvocation(Path.of("job.py"), argv, null, Path.of("drive.sh"), 1);
            ScriptAnalysis a = new ScriptAnalyzer().analyze(ws, Path.of("job.py"), AnalysisContext.defaults().withInvocations(List.of(run)));
            List<DataReference> refs = a.references();
            DataReference months = refs.get(2);
            String monthPaths = months.isGlob() ? String.join(",", months.instances()) : months.pathPattern();
            assertThat(List.of(refs.get(0).pathPattern(), refs.get(1).pathPattern(), monthPaths, refs.get(3).pathPattern()))
                    .as("command line %s", argv).containsExactlyElementsOf(python);
        }
    }
}
