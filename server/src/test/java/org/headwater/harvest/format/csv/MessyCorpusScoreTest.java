package org.headwater.harvest.format.csv;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import org.headwater.cli.Main;
import org.headwater.testing.Python;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code headwater sniff --json} against ground truth on a generated corpus of messy files, scored key by key,
 * with Python's {@code csv.Sniffer} (the standard library's dialect guesser) scored on the same files as the
 * baseline. The generator (messy_corpus.py) writes every file with Python's csv.writer and records what it
 * wrote; it hands the Sniffer text already decoded, so the baseline is, if anything, favoured.
 */
class MessyCorpusScoreTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int FILES = 300;

    @TempDir
    Path out;

    /** Right and counted answers of one reader on one key. */
    static final class Score {
        int right;
        int counted;

        void add(boolean ok) {
            counted++;
            if (ok) {
                right++;
            }
        }

        double rate() {
            return counted == 0 ? 1.0 : (double) right / counted;
        }
    }

    @Test
    void sniffBeatsPythonsCsvSnifferOnEveryKeyOfAMessyCorpus() throws Exception {
        Python.requireAvailable();
        Path corpus = Files.createDirectories(out.resolve("corpus"));
        Python.run(Workspaces.repoRoot().resolve("server/src/test/resources/csv/messy_corpus.py"),
                corpus.toString(), Integer.toString(FILES), System.getProperty("corpusSeed", "20261202"));
        JsonNode truth = JSON.readTree(corpus.resolve("truth.json").toFile());
        JsonNode sniffer = JSON.readTree(corpus.resolve("sniffer.json").toFile());

        List<String> args = new ArrayList<>(List.of("sniff", "--json"));
        try (Stream<Path> files = Files.list(corpus)) {
            files.filter(p -> p.getFileName().toString().startsWith("f_")).sorted().forEach(p -> args.add(p.toString()));
        }
        StringWriter printed = new StringWriter();
        int exit = Main.run(new PrintWriter(printed, true), new PrintWriter(new StringWriter(), true), args.toArray(String[]::new));
        assertThat(exit).isZero();
        Map<String, JsonNode> ours = new LinkedHashMap<>();
        JSON.readTree(printed.toString()).forEach(r -> ours.put(Path.of(r.get("path").asText()).getFileName().toString(), r));
        assertThat(ours).hasSize(FILES);

        Map<String, Score> hw = new LinkedHashMap<>();
        Map<String, Score> py = new LinkedHashMap<>();
        for (String key : List.of("dialect", "delimiter", "quote", "escape", "header", "skip_lines", "encoding",
                "column_count", "column_names", "column_types", "row_count")) {
            hw.put(key, new Score());
            py.put(key, new Score());
        }
        List<String> misses = new ArrayList<>();
        truth.fields().forEachRemaining(entry -> {
            JsonNode t = entry.getValue();
            JsonNode r = ours.get(entry.getKey());
            int before = hw.get("dialect").right + hw.get("header").right;
            scoreOurs(t, r, hw);
            if (hw.get("dialect").right + hw.get("header").right - before < 2) {
                misses.add(entry.getKey() + ": truth " + t + "\n    ours " + r);
            }
            scoreSniffer(t, sniffer.get(entry.getKey()), py);
        });

        System.out.printf("messy corpus, %d files: key, headwater sniff, python csv.Sniffer%n", FILES);
        hw.forEach((key, s) -> System.out.printf("  %-13s %.3f  %.3f%n", key, s.rate(), py.get(key).rate()));
        misses.stream().limit(12).forEach(m -> System.out.println("  dialect or header missed: " + m));

        // Targets of issue 3: dialect and header at least 0.98, types at least 0.95.
        assertThat(hw.get("dialect").rate()).isGreaterThanOrEqualTo(0.98);
        assertThat(hw.get("header").rate()).isGreaterThanOrEqualTo(0.98);
        assertThat(hw.get("column_types").rate()).isGreaterThanOrEqualTo(0.95);
        for (String key : hw.keySet()) {
            // Never worse than the baseline on any key, and clearly better (two points or more) wherever the
            // baseline leaves room for it: on delimiter and quote, handed decoded text, it scores 0.99 to 1.00.
            double mine = hw.get(key).rate();
            double theirs = py.get(key).rate();
            assertThat(mine).as(key + " vs csv.Sniffer").isGreaterThanOrEqualTo(theirs - 0.005);
            if (theirs < 0.97) {
                assertThat(mine).as(key + " margin over csv.Sniffer").isGreaterThanOrEqualTo(theirs + 0.02);
            }
        }
    }

    private static void scoreOurs(JsonNode t, JsonNode r, Map<String, Score> s) {
        boolean csv = r != null && "csv".equals(text(r, "format"));
        boolean delimiter = csv && t.get("delimiter").asText().equals(text(r, "delimiter"));
        boolean quote = t.get("quote").isNull() || csv && t.get("quote").asText().equals(text(r, "quote"));
        boolean escape = t.get("escape").isNull() || csv && t.get("escape").asText().equals(text(r, "escape"));
        s.get("delimiter").add(delimiter);
        if (!t.get("quote").isNull()) {
            s.get("quote").add(quote);
        }
        if (!t.get("escape").isNull()) {
            s.get("escape").add(escape);
        }
        s.get("dialect").add(delimiter && quote && escape);
        s.get("header").add(csv && r.get("header").asBoolean() == t.get("header").asBoolean());
        s.get("skip_lines").add(csv && r.get("skip_lines").asInt() == t.get("skip_lines").asInt());
        s.get("encoding").add(r != null && sameEncoding(t.get("encoding").asText(), text(r, "encoding")));
        List<String> names = new ArrayList<>();
        List<String> types = new ArrayList<>();
        if (csv) {
            r.get("columns").forEach(c -> {
                names.add(c.get("name").asText());
                types.add(c.get("type").asText());
            });
        }
        scoreColumns(t, names, types, csv ? r.get("row_count").asLong() : -1, s);
    }

    private static void scoreSniffer(JsonNode t, JsonNode r, Map<String, Score> s) {
        boolean ok = r != null && !r.has("error");
        boolean delimiter = ok && t.get("delimiter").asText().equals(r.get("delimiter").asText());
        boolean quote = t.get("quote").isNull() || ok && t.get("quote").asText().equals(r.get("quote").asText());
        boolean escape = t.get("escape").isNull() || ok && t.get("escape").asText().equals(r.get("escape").asText());
        s.get("delimiter").add(delimiter);
        if (!t.get("quote").isNull()) {
            s.get("quote").add(quote);
        }
        if (!t.get("escape").isNull()) {
            s.get("escape").add(escape);
        }
        s.get("dialect").add(delimiter && quote && escape);
        s.get("header").add(ok && r.hasNonNull("header") && r.get("header").asBoolean() == t.get("header").asBoolean());
        // csv.Sniffer has no notion of preamble lines: it answers 0 for every file.
        s.get("skip_lines").add(t.get("skip_lines").asInt() == 0);
        // Nor of encodings: a reader using it assumes UTF-8.
        s.get("encoding").add(t.get("encoding").asText().equals("utf-8") && !t.get("bom").asBoolean());
        List<String> names = new ArrayList<>();
        List<String> types = new ArrayList<>();
        if (ok) {
            int count = r.get("columns").asInt();
            for (int i = 0; i < count; i++) {
                JsonNode header = r.get("names");
                names.add(header != null && !header.isNull() && i < header.size() ? header.get(i).asText() : "");
                // Nor of types: every column is text to it.
                types.add("text");
            }
        }
        scoreColumns(t, names, types, ok ? r.get("row_count").asLong() : -1, s);
    }

    /** Column count, names (files with a header only), types (one score per true column) and rows. */
    private static void scoreColumns(JsonNode t, List<String> names, List<String> types, long rows, Map<String, Score> s) {
        JsonNode columns = t.get("columns");
        s.get("column_count").add(names.size() == columns.size());
        if (t.get("header").asBoolean()) {
            List<String> expected = new ArrayList<>();
            columns.forEach(c -> expected.add(c.get("name").asText()));
            s.get("column_names").add(expected.equals(names));
        }
        for (int i = 0; i < columns.size(); i++) {
            s.get("column_types").add(i < types.size() && columns.get(i).get("type").asText().equals(types.get(i)));
        }
        s.get("row_count").add(rows == t.get("row_count").asLong());
    }

    /**
     * Windows-1252 and ISO-8859-1 decode every letter the generator uses (U+00C0 to U+00FF) to the same bytes,
     * so either name is right for those files; UTF-16 with a BOM may be named by its byte order.
     * (The code charts of both charsets, common practice, no source.)
     */
    private static boolean sameEncoding(String truth, String ours) {
        if (ours == null) {
            return false;
        }
        Set<String> latin = Set.of("windows-1252", "iso-8859-1", "iso-8859-15");
        Set<String> utf16 = Set.of("utf-16", "utf-16le", "utf-16be");
        return truth.equals(ours) || latin.contains(truth) && latin.contains(ours) || utf16.contains(truth) && utf16.contains(ours);
    }

    private static String text(JsonNode r, String key) {
        JsonNode v = r.get(key);
        return v == null || v.isNull() ? null : v.asText();
    }
}
