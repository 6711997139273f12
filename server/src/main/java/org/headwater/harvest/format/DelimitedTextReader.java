package org.headwater.harvest.format;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;

/**
 * Reads CSV-family files: picks the delimiter whose count per line is most consistent, reads the first
 * row as the header and guesses each column's type from the sampled rows. This is the walking-skeleton
 * reader; the dialect-scoring detector replaces its delimiter choice.
 */
public final class DelimitedTextReader implements FormatReader {
    private static final Set<String> EXTENSIONS = Set.of("csv", "tsv", "tab", "psv");
    /** Endings that are sometimes tables and sometimes prose: accepted only when the lines look delimited. */
    private static final Set<String> MAYBE_EXTENSIONS = Set.of("txt", "dat");
    private static final char[] DELIMITERS = {',', ';', '\t', '|'};
    private static final int MAX_SAMPLE_ROWS = 2000;

    @Override
    public boolean accepts(Sample sample) {
        if (EXTENSIONS.contains(sample.extension())) {
            return true;
        }
        return MAYBE_EXTENSIONS.contains(sample.extension()) && !TextDecoding.looksBinary(sample.head())
                && looksDelimited(TextDecoding.decode(sample.head(), sample.complete()).text());
    }

    /** At least two lines, and one candidate delimiter occurring the same, non-zero number of times on each. */
    static boolean looksDelimited(String text) {
        List<String> lines = new ArrayList<>();
        for (String line : text.split("\r\n|\n|\r", 22)) {
            if (!line.isBlank() && lines.size() < 20) {
                lines.add(line);
            }
        }
        if (lines.size() < 2) {
            return false;
        }
        for (char d : DELIMITERS) {
            int first = countOutsideQuotes(lines.get(0), d);
            if (first > 0 && lines.stream().allMatch(l -> countOutsideQuotes(l, d) == first)) {
                return true;
            }
        }
        return false;
    }

    @Override
    public Reading read(Sample sample) throws UnreadableFileException {
        if (TextDecoding.looksBinary(sample.head())) {
            throw new UnreadableFileException("binary", "The file holds binary data, not delimited text");
        }
        TextDecoding.Decoded decoded = TextDecoding.decode(sample.head(), sample.complete());
        String text = decoded.text();
        int skip = 0;
        Character declared = null;
        // An Excel-style first line "sep=;" declares the delimiter.
        if (text.startsWith("sep=") && text.length() > 4) {
            declared = text.charAt(4);
            text = text.substring(text.indexOf('\n') + 1);
            skip = 1;
        }
        char delimiter = declared != null ? declared : chooseDelimiter(text);
        List<List<String>> rows = new CsvRecords(text, delimiter, '"').read(MAX_SAMPLE_ROWS + 1, !sample.complete());
        if (rows.isEmpty()) {
            return new Reading("csv", DatasetKind.FILE, List.of(), 0L, sample.complete(), details(decoded, delimiter, skip));
        }
        List<String> header = rows.get(0);
        List<List<String>> body = rows.subList(1, rows.size());
        List<ColumnDef> columns = new ArrayList<>();
        for (int c = 0; c < header.size(); c++) {
            List<String> values = new ArrayList<>(body.size());
            boolean nullable = false;
            for (List<String> row : body) {
                String v = c < row.size() ? row.get(c) : "";
                nullable |= ValueTypes.isMissing(v);
                values.add(v);
            }
            String name = header.get(c).trim();
            columns.add(new ColumnDef(name.isEmpty() ? "column_" + (c + 1) : name, ValueTypes.guess(values), nullable));
        }
        long rowCount;
        boolean exact = sample.complete() && rows.size() <= MAX_SAMPLE_ROWS;
        if (exact) {
            rowCount = body.size();
        } else {
            // Estimate from the sample's bytes per row; the later detector counts exactly up to a size cap.
            double bytesPerRow = (double) sample.head().length / Math.max(1, rows.size());
            rowCount = Math.max(body.size(), Math.round(sample.size() / bytesPerRow) - 1);
        }
        return new Reading("csv", DatasetKind.FILE, columns, rowCount, exact, details(decoded, delimiter, skip));
    }

    private static Map<String, Object> details(TextDecoding.Decoded decoded, char delimiter, int skip) {
        Map<String, Object> details = new LinkedHashMap<>();
        details.put("encoding", decoded.charset().name().toLowerCase(java.util.Locale.ROOT));
        details.put("bom", decoded.bom());
        details.put("delimiter", String.valueOf(delimiter));
        details.put("skip_lines", skip);
        return details;
    }

    /** The candidate that occurs on the first lines most often with the same count per line. */
    static char chooseDelimiter(String text) {
        String[] lines = text.split("\r\n|\n|\r", 31);
        int n = Math.min(lines.length, 30);
        char best = ',';
        double bestScore = -1;
        for (char d : DELIMITERS) {
            Map<Integer, Integer> countsPerLine = new LinkedHashMap<>();
            int used = 0;
            for (int i = 0; i < n; i++) {
                if (lines[i].isBlank()) {
                    continue;
                }
                int count = countOutsideQuotes(lines[i], d);
                countsPerLine.merge(count, 1, Integer::sum);
                used++;
            }
            int modeCount = 0;
            int mode = 0;
            for (Map.Entry<Integer, Integer> e : countsPerLine.entrySet()) {
                if (e.getValue() > modeCount) {
                    modeCount = e.getValue();
                    mode = e.getKey();
                }
            }
            if (mode == 0 || used == 0) {
                continue;
            }
            // Consistency first, then the number of fields it makes.
            double score = (double) modeCount / used * 1000 + mode;
            if (score > bestScore) {
                bestScore = score;
                best = d;
            }
        }
        return best;
    }

    private static int countOutsideQuotes(String line, char delimiter) {
        int count = 0;
        boolean quoted = false;
        for (int i = 0; i < line.length(); i++) {
            char ch = line.charAt(i);
            if (ch == '"') {
                quoted = !quoted;
            } else if (ch == delimiter && !quoted) {
                count++;
            }
        }
        return count;
    }
}
