package org.headwater.analysis.script;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Random;

/**
 * Not a test: generates 400 synthetic scripts (Python, R, notebooks, R Markdown; invented content)
 * and prints the wall time of analysing them all and the median per script. Run with
 * {@code java -cp <test classpath> org.headwater.analysis.script.ScriptAnalysisBenchmark [count]}.
 */
public final class ScriptAnalysisBenchmark {
    private ScriptAnalysisBenchmark() {
    }

    public static void main(String[] args) throws IOException {
        int count = args.length > 0 ? Integer.parseInt(args[0]) : 400;
        Path ws = Files.createTempDirectory("headwater-bench");
        Random random = new Random(42);
        List<Path> scripts = new ArrayList<>();
        Files.writeString(ws.resolve("settings.py"), "RAW = 'raw'\nOUT = 'work'\n");
        for (int i = 0; i < count; i++) {
            int kind = i % 10;
            Path p = switch (kind) {
                case 0, 1, 2, 3, 4 -> write(ws, "py/job_" + i + ".py", python(i, random));
                case 5, 6 -> write(ws, "r/model_" + i + ".R", r(i, random));
                case 7, 8 -> write(ws, "nb/explore_" + i + ".ipynb", notebook(i, random));
                default -> write(ws, "doc/report_" + i + ".Rmd", "---\ntitle: r\n---\n\n```{r}\n" + r(i, random) + "```\n");
            };
            scripts.add(ws.relativize(p));
        }
        ScriptAnalyzer analyzer = new ScriptAnalyzer();
        // Warm-up: load the native parsers and the JIT before measuring.
        for (int i = 0; i < Math.min(20, scripts.size()); i++) {
            analyzer.analyze(ws, scripts.get(i), AnalysisContext.defaults());
        }
        List<Long> each = new ArrayList<>();
        List<Long> cpu = new ArrayList<>();
        java.lang.management.ThreadMXBean threads = java.lang.management.ManagementFactory.getThreadMXBean();
        int references = 0;
        long start = System.nanoTime();
        for (Path s : scripts) {
            long t = System.nanoTime();
            long c = threads.getCurrentThreadCpuTime();
            references += analyzer.analyze(ws, s, AnalysisContext.defaults()).references().size();
            cpu.add(threads.getCurrentThreadCpuTime() - c);
            each.add(System.nanoTime() - t);
        }
        long wall = System.nanoTime() - start;
        Collections.sort(each);
        Collections.sort(cpu);
        // CPU time too: on a shared machine wall time also counts other processes' turns.
        System.out.printf("scripts: %d, references: %d, wall: %.0f ms, median per script: %.2f ms wall / %.2f ms CPU, p95: %.2f ms wall%n",
                scripts.size(), references, wall / 1e6, each.get(each.size() / 2) / 1e6, cpu.get(cpu.size() / 2) / 1e6,
                each.get((int) (each.size() * 0.95)) / 1e6);
    }

    private static Path write(Path ws, String rel, String text) throws IOException {
        Path p = ws.resolve(rel);
        Files.createDirectories(p.getParent());
        Files.writeString(p, text);
        return p;
    }

    private static String python(int i, Random random) {
        StringBuilder sb = new StringBuilder("import argparse\nimport os\nfrom pathlib import Path\nimport pandas as pd\n"
                + "import matplotlib.pyplot as plt\nfrom settings import RAW, OUT\n\n"
                + "parser = argparse.ArgumentParser()\nparser.add_argument('--months', nargs='+', type=int, default=[1, 2, 3])\n"
                + "parser.add_argument('--out', default=os.path.join(OUT, 'result_" + i + ".csv'))\nargs = parser.parse_args()\n\n");
        int steps = 5 + random.nextInt(10);
        for (int s = 0; s < steps; s++) {
            sb.append("def step_").append(s).append("(base):\n")
                    .append("    frames = []\n")
                    .append("    for m in args.months:\n")
                    .append("        frames.append(pd.read_csv(f'{base}/part_").append(s).append("_{m:02d}.csv'))\n")
                    .append("    df = pd.concat(frames)\n")
                    .append("    df = df.rename(columns={'a': 'b'})\n")
                    .append("    df['c'] = df['b'] * ").append(s + 1).append("\n")
                    .append("    if False:\n        pd.read_csv('never.csv')\n")
                    .append("    return df[['b', 'c']]\n\n");
        }
        sb.append("parts = [step_").append(0).append("(RAW)]\n");
        for (int s = 1; s < steps; s++) {
            sb.append("parts.append(step_").append(s).append("(Path(RAW) / 'sub'))\n");
        }
        sb.append("out = pd.concat(parts)\nout.to_csv(args.out)\nplt.savefig(f'figures/fig_").append(i).append(".png')\n");
        return sb.toString();
    }

    private static String r(int i, Random random) {
        StringBuilder sb = new StringBuilder("library(readr)\nlibrary(dplyr)\nargs <- commandArgs(trailingOnly = TRUE)\n"
                + "input <- if (length(args) >= 1) args[1] else file.path('raw', 'input_" + i + ".csv')\n");
        int steps = 3 + random.nextInt(6);
        for (int s = 0; s < steps; s++) {
            sb.append("for (yr in 2020:2024) {\n  d").append(s).append(" <- read_csv(sprintf('raw/y%d/part_").append(s).append(".csv', yr))\n}\n")
                    .append("r").append(s).append(" <- read_csv(input) |> mutate(x").append(s).append(" = a * 2) |> select(a, x").append(s).append(")\n")
                    .append("write_csv(r").append(s).append(", paste0('work/out_").append(i).append("_").append(s).append(".csv'))\n");
        }
        sb.append("ggplot2::ggsave(file.path('figures', 'plot_").append(i).append(".pdf'))\n");
        return sb.toString();
    }

    private static String notebook(int i, Random random) {
        StringBuilder cells = new StringBuilder("{\"cells\": [");
        int n = 4 + random.nextInt(8);
        for (int c = 0; c < n; c++) {
            if (c > 0) {
                cells.append(",");
            }
            String src = c == 0 ? "%matplotlib inline\\nimport pandas as pd\\nimport matplotlib.pyplot as plt"
                    : "df" + c + " = pd.read_parquet('../data/table_" + c + ".parquet')\\n!ls ../data\\ndf" + c
                    + ".describe().to_csv('../work/stats_" + i + "_" + c + ".csv')\\nplt.savefig('../figures/nb_" + i + "_" + c + ".png')";
            cells.append("{\"cell_type\": \"code\", \"metadata\": {}, \"outputs\": [], \"source\": \"").append(src).append("\"}");
        }
        return cells.append("], \"metadata\": {}, \"nbformat\": 4, \"nbformat_minor\": 5}").toString();
    }
}
