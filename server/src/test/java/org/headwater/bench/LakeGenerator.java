package org.headwater.bench;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;

/**
 * Writes a synthetic lake: {@code tables} tables of {@code partitionsPerTable} files each in nested
 * {@code key=value} folders, cycling through comma CSV, TSV, semicolon CSV with decimal commas, JSON
 * arrays and NDJSON, plus {@code scripts} small Python and R scripts. Deterministic for a given seed.
 * The defaults (50 tables x 1,000 partitions, about 13 KB a file) make the 50,000-file, ~650 MB lake of
 * the harvest benchmark.
 */
public final class LakeGenerator {
    private static final String[] FORMATS = {"csv", "tsv", "semicolon", "json", "ndjson"};

    private final int tables;
    private final int partitionsPerTable;
    private final int rowsPerFile;
    private final int scripts;
    private final Random random = new Random(20261201L);

    public LakeGenerator(int tables, int partitionsPerTable, int rowsPerFile, int scripts) {
        this.tables = tables;
        this.partitionsPerTable = partitionsPerTable;
        this.rowsPerFile = rowsPerFile;
        this.scripts = scripts;
    }

    public static LakeGenerator standard() {
        return new LakeGenerator(50, 1000, 200, 400);
    }

    /** Writes the lake under {@code root} and returns the number of files written. */
    public int write(Path root) throws IOException {
        int files = 0;
        for (int t = 0; t < tables; t++) {
            String format = FORMATS[t % FORMATS.length];
            for (int p = 0; p < partitionsPerTable; p++) {
                Path dir = root.resolve(String.format(Locale.ROOT, "table_%02d/region=r%d/year=%d/month=%02d",
                        t, p % 10, 2016 + (p / 10) % 10, 1 + (p / 100) % 12));
                Files.createDirectories(dir);
                // region x year x month is unique for p below 1,000, so one file per folder suffices.
                writeTable(dir.resolve("readings." + extension(format)), format, t);
                files++;
            }
        }
        Path scriptDir = Files.createDirectories(root.resolve("scripts"));
        for (int s = 0; s < scripts; s++) {
            boolean python = s % 4 != 3;
            Path file = scriptDir.resolve(String.format(Locale.ROOT, "step_%03d.%s", s, python ? "py" : "R"));
            int table = s % tables;
            String text = python
                    ? "import pandas as pd\n\nframe = pd.read_csv(\"table_%02d/region=r0/year=2016/month=01/readings.csv\")\n"
                            .formatted(table) + "frame.to_csv(\"derived/out_%03d.csv\", index=False)\n".formatted(s)
                    : "library(readr)\nx <- read_csv(\"table_%02d/region=r0/year=2016/month=01/readings.csv\")\n"
                            .formatted(table) + "write_csv(x, \"derived/out_%03d.csv\")\n".formatted(s);
            Files.writeString(file, text);
            files++;
        }
        return files;
    }

    private static String extension(String format) {
        return switch (format) {
            case "tsv" -> "tsv";
            case "json" -> "json";
            case "ndjson" -> "ndjson";
            default -> "csv";
        };
    }

    private void writeTable(Path file, String format, int table) throws IOException {
        String[] columns = {"station_id", "observed_at", "value_" + table, "quality_flag", "note"};
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            switch (format) {
                case "json" -> w.write("[\n");
                case "ndjson" -> { }
                default -> w.write(String.join(separator(format), columns) + "\n");
            }
            for (int r = 0; r < rowsPerFile; r++) {
                String station = "ST-" + (100 + random.nextInt(900));
                String time = String.format(Locale.ROOT, "2025-%02d-%02dT%02d:%02d:00Z", 1 + random.nextInt(12),
                        1 + random.nextInt(28), random.nextInt(24), random.nextInt(60));
                double value = random.nextDouble() * 100;
                int flag = random.nextInt(4);
                String note = random.nextInt(10) == 0 ? "checked by field team" : "";
                switch (format) {
                    case "json", "ndjson" -> {
                        String record = String.format(Locale.ROOT,
                                "{\"station_id\": \"%s\", \"observed_at\": \"%s\", \"value_%d\": %.3f, \"quality_flag\": %d, \"note\": \"%s\"}",
                                station, time, table, value, flag, note);
                        if (format.equals("json")) {
                            w.write(r == 0 ? "  " + record : ",\n  " + record);
                        } else {
                            w.write(record + "\n");
                        }
                    }
                    case "semicolon" -> w.write(String.join(";", station, time,
                            String.format(Locale.ROOT, "%.3f", value).replace('.', ','), Integer.toString(flag), note) + "\n");
                    default -> w.write(String.join(separator(format), station, time,
                            String.format(Locale.ROOT, "%.3f", value), Integer.toString(flag), note) + "\n");
                }
            }
            if (format.equals("json")) {
                w.write("\n]\n");
            }
        }
    }

    private static String separator(String format) {
        return switch (format) {
            case "tsv" -> "\t";
            case "semicolon" -> ";";
            default -> ",";
        };
    }

    public static void main(String[] args) throws IOException {
        Path root = Path.of(args.length > 0 ? args[0] : "target/lake");
        long started = System.nanoTime();
        int files = standard().write(root);
        System.out.printf("wrote %,d files under %s in %.1f s%n", files, root, (System.nanoTime() - started) / 1e9);
    }
}
