package org.headwater.harvest.format;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.headwater.harvest.format.csv.CsvSniff;
import org.headwater.harvest.format.csv.CsvSniffer;
import org.headwater.harvest.format.csv.NotDelimitedTextException;
import org.headwater.model.ColumnDef;

/**
 * Says what one file holds, by its content, in the fixed shape of {@code headwater sniff --json}: format
 * (csv, json, ndjson, parquet, image, pdf, text, binary), encoding, dialect, header, columns, counts.
 * The extension is used only to break ties.
 */
public final class FileSniffer {
    /** Every key of a result, in order; absent facts are null, so every result has the same keys. */
    static final List<String> KEYS = List.of("format", "encoding", "bom", "delimiter", "quote", "escape",
            "line_terminator", "header", "skip_lines", "footer_lines", "decimal_separator", "thousands_separator",
            "columns", "row_count", "row_count_exact", "fields", "records_path", "record_count", "error");

    private static final JsonRecordsReader JSON = new JsonRecordsReader();

    private FileSniffer() {
    }

    /** A result that says only what went wrong. */
    public static Map<String, Object> failure(String error) {
        Map<String, Object> r = empty();
        r.put("format", "binary");
        r.put("error", error);
        return r;
    }

    public static Map<String, Object> sniff(String fileName, byte[] bytes, boolean complete, long size) {
        Map<String, Object> r = empty();
        String magic = magic(bytes);
        if (magic != null) {
            r.put("format", magic);
            return r;
        }
        if (TextDecoding.looksBinary(bytes)) {
            r.put("format", "binary");
            return r;
        }
        Sample sample = new Sample(fileName, bytes, complete, size);
        if (startsLikeJson(bytes) && json(sample, r)) {
            return r;
        }
        try {
            CsvSniff sniff = new CsvSniffer().sniff(bytes, complete, size);
            boolean namedTable = List.of("csv", "tsv", "tab", "psv").contains(sample.extension());
            if (namedTable || DelimitedTextReader.looksLikeTable(sniff)) {
                csv(sniff, r);
                return r;
            }
            r.put("encoding", sniff.encodingName());
            r.put("bom", sniff.bom());
        } catch (NotDelimitedTextException e) {
            r.put("encoding", TextDecoding.decode(bytes, complete).charset().name().toLowerCase(java.util.Locale.ROOT));
        }
        r.put("format", "text");
        return r;
    }

    private static Map<String, Object> empty() {
        Map<String, Object> r = new LinkedHashMap<>();
        KEYS.forEach(k -> r.put(k, null));
        return r;
    }

    /** Formats told by their first bytes (their specifications' signatures). */
    private static String magic(byte[] b) {
        String head = new String(b, 0, Math.min(b.length, 512), StandardCharsets.ISO_8859_1);
        if (head.startsWith("\u0089PNG\r\n\u001a\n") || head.startsWith("\u00ff\u00d8\u00ff")
                || head.startsWith("GIF87a") || head.startsWith("GIF89a")) {
            return "image";
        }
        if (head.startsWith("%PDF-")) {
            return "pdf";
        }
        if (head.startsWith("PAR1")) {
            return "parquet";
        }
        String text = head.stripLeading();
        if ((text.startsWith("<?xml") || text.startsWith("<svg") || text.startsWith("<!DOCTYPE svg")) && head.contains("<svg")) {
            return "image";
        }
        return null;
    }

    private static boolean startsLikeJson(byte[] bytes) {
        String text = TextDecoding.decode(bytes, false).text().stripLeading();
        return text.startsWith("{") || text.startsWith("[");
    }

    private static boolean json(Sample sample, Map<String, Object> r) {
        Reading reading;
        try {
            reading = JSON.read(sample);
        } catch (UnreadableFileException e) {
            // A file that starts like JSON but does not parse is reported as JSON with its error: that is
            // what a person would say of a truncated export.
            r.put("format", "json");
            r.put("encoding", TextDecoding.decode(sample.head(), sample.complete()).charset().name().toLowerCase(java.util.Locale.ROOT));
            r.put("error", e.getMessage());
            return true;
        }
        r.put("format", reading.format());
        TextDecoding.Decoded decoded = TextDecoding.decode(sample.head(), sample.complete());
        r.put("encoding", decoded.charset().name().toLowerCase(java.util.Locale.ROOT));
        r.put("bom", decoded.bom());
        r.put("columns", columns(reading.columns()));
        r.put("row_count", reading.rowCount());
        r.put("row_count_exact", reading.rowCountExact());
        r.put("fields", reading.details().get("fields"));
        r.put("records_path", reading.details().get("records_path"));
        r.put("record_count", reading.rowCount());
        return true;
    }

    private static void csv(CsvSniff sniff, Map<String, Object> r) {
        r.put("format", "csv");
        Map<String, Object> details = DelimitedTextReader.details(sniff, List.of());
        for (String key : List.of("encoding", "bom", "delimiter", "quote", "escape", "line_terminator", "header",
                "skip_lines", "footer_lines", "decimal_separator", "thousands_separator")) {
            r.put(key, details.get(key));
        }
        List<ColumnDef> columns = new ArrayList<>();
        sniff.columns().forEach(c -> columns.add(new ColumnDef(c.name(), DelimitedTextReader.word(c.type()), c.nullable())));
        r.put("columns", columns(columns));
        r.put("row_count", sniff.rowCount());
        r.put("row_count_exact", sniff.rowCountExact());
    }

    private static List<Map<String, Object>> columns(List<ColumnDef> columns) {
        List<Map<String, Object>> out = new ArrayList<>();
        if (columns != null) {
            for (ColumnDef c : columns) {
                Map<String, Object> m = new LinkedHashMap<>();
                m.put("name", c.name());
                m.put("type", c.dataType());
                m.put("nullable", c.nullable());
                out.add(m);
            }
        }
        return out;
    }
}
