package org.headwater.cli;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.headwater.harvest.format.FileSniffer;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater sniff FILE...}: what Headwater reads in files, without a catalog. */
@Command(name = "sniff", mixinStandardHelpOptions = true,
        description = {"Detect the format, encoding, dialect, header and columns of files, by their content.",
                "Prints one result per file; nothing is stored. Files up to 64 MiB are read whole, so their",
                "row counts are exact; larger ones are sampled and their counts estimated."})
final class SniffCommand implements Callable<Integer> {
    /** Files up to this size are read whole; the sniff of a single file can afford what a harvest cannot. */
    static final int WHOLE_FILE_CAP = 64 * 1024 * 1024;
    static final int SAMPLE_BYTES = 64 * 1024;

    @Parameters(arity = "1..*", paramLabel = "FILE", description = "Files to look at.")
    List<Path> files;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        List<Map<String, Object>> results = new ArrayList<>();
        boolean problems = false;
        for (Path file : files) {
            Map<String, Object> result;
            try {
                long size = Files.size(file);
                byte[] bytes = read(file, size);
                result = FileSniffer.sniff(file.getFileName().toString(), bytes, bytes.length >= size, size);
            } catch (IOException e) {
                result = FileSniffer.failure("cannot read the file: " + e.getMessage());
            }
            Map<String, Object> withPath = new LinkedHashMap<>();
            withPath.put("path", file.toString());
            withPath.putAll(result);
            problems |= withPath.get("error") != null;
            results.add(withPath);
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, results);
        } else {
            for (Map<String, Object> r : results) {
                out.printf("%s: %s%s%s%n", r.get("path"), r.get("format"),
                        r.get("encoding") == null ? "" : ", " + r.get("encoding"),
                        r.get("error") == null ? "" : " (" + r.get("error") + ")");
                if (r.get("delimiter") != null) {
                    out.printf("  delimiter %s, quote %s, escape %s, header %s, skip %s lines, %s rows%s%n",
                            printable((String) r.get("delimiter")), r.get("quote"), r.get("escape"), r.get("header"),
                            r.get("skip_lines"), r.get("row_count"), Boolean.TRUE.equals(r.get("row_count_exact")) ? "" : " (estimated)");
                }
                @SuppressWarnings("unchecked")
                List<Map<String, Object>> columns = (List<Map<String, Object>>) r.get("columns");
                if (columns != null) {
                    columns.forEach(c -> out.printf("    %-40s %s%n", c.get("name"), c.get("type")));
                }
            }
            out.flush();
        }
        return problems ? Main.PROBLEMS : Main.OK;
    }

    private static String printable(String delimiter) {
        return delimiter.equals("\t") ? "TAB" : delimiter.equals(" ") ? "SPACE" : delimiter;
    }

    private static byte[] read(Path file, long size) throws IOException {
        if (size <= WHOLE_FILE_CAP) {
            return Files.readAllBytes(file);
        }
        try (InputStream in = Files.newInputStream(file)) {
            return in.readNBytes(SAMPLE_BYTES);
        }
    }
}
