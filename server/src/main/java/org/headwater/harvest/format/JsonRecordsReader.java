package org.headwater.harvest.format;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;

/**
 * Reads JSON that holds records: an array of objects, an object holding such an array, or one object
 * per line (NDJSON). Columns are the field paths in dot notation, with {@code []} for arrays.
 */
public final class JsonRecordsReader implements FormatReader {
    private static final Set<String> EXTENSIONS = Set.of("json", "ndjson", "jsonl", "geojson");
    private static final ObjectMapper MAPPER = new ObjectMapper();
    private static final int MAX_RECORDS = 5000;

    @Override
    public boolean accepts(Sample sample) {
        if (EXTENSIONS.contains(sample.extension())) {
            return true;
        }
        // Any other name: JSON by content. The first-byte test keeps this cheap for the many files that
        // cannot be JSON; the sniffer then insists on a parse, so a CSV whose header starts with '[' stays CSV.
        if (!startsLikeJson(sample.head())) {
            return false;
        }
        String format = ContentSniffer.sniff(sample).format();
        return format.equals("json") || format.equals("ndjson");
    }

    /** Whether the first character after whitespace (and a UTF-8 BOM) opens a JSON object or array. */
    static boolean startsLikeJson(byte[] head) {
        int i = head.length >= 3 && (head[0] & 0xff) == 0xEF && (head[1] & 0xff) == 0xBB && (head[2] & 0xff) == 0xBF ? 3 : 0;
        while (i < head.length && (head[i] == ' ' || head[i] == '\t' || head[i] == '\r' || head[i] == '\n')) {
            i++;
        }
        return i < head.length && (head[i] == '{' || head[i] == '[');
    }

    @Override
    public Reading read(Sample sample) throws UnreadableFileException {
        String text = TextDecoding.decode(sample.head(), sample.complete()).text().strip();
        boolean lines = sample.extension().equals("ndjson") || sample.extension().equals("jsonl");
        Collected collected = new Collected();
        String recordsPath = null;
        try {
            if (lines || looksLikeLines(text)) {
                readLines(text, sample.complete(), collected);
                return reading("ndjson", collected, sample, null);
            }
            try (JsonParser parser = MAPPER.getFactory().createParser(text)) {
                JsonToken first = parser.nextToken();
                if (first == JsonToken.START_ARRAY) {
                    readArray(parser, collected);
                } else if (first == JsonToken.START_OBJECT) {
                    recordsPath = readObject(parser, collected);
                } else {
                    throw new UnreadableFileException("invalid", "The file does not start with a JSON object or array");
                }
            }
        } catch (IOException e) {
            if (sample.complete() || collected.records == 0) {
                throw new UnreadableFileException(sample.complete() ? "invalid" : "truncated",
                        "Invalid JSON: " + (e instanceof com.fasterxml.jackson.core.JsonProcessingException j ? j.getOriginalMessage() + " at line " + j.getLocation().getLineNr() : e.getMessage()));
            }
            // A cut sample ends mid-record: what was read before the cut still counts.
        }
        Map<String, Object> extra = new LinkedHashMap<>();
        if (recordsPath != null) {
            extra.put("records_path", recordsPath);
        }
        return reading("json", collected, sample, extra);
    }

    /** An object that ends on the first line, and another that starts after it (without copying the text). */
    private static boolean looksLikeLines(String text) {
        int nl = text.indexOf('\n');
        if (!text.startsWith("{") || nl <= 0) {
            return false;
        }
        int last = nl - 1;
        while (last >= 0 && Character.isWhitespace(text.charAt(last))) {
            last--;
        }
        int next = nl;
        while (next < text.length() && Character.isWhitespace(text.charAt(next))) {
            next++;
        }
        return last >= 0 && text.charAt(last) == '}' && next < text.length() && text.charAt(next) == '{';
    }

    private static void readLines(String text, boolean complete, Collected collected) throws UnreadableFileException {
        // One parser per line over a shared char array: no String per line, no regular expression.
        char[] chars = text.toCharArray();
        int lineNumber = 0;
        for (int start = 0; start < chars.length && collected.records < MAX_RECORDS; ) {
            int end = start;
            while (end < chars.length && chars[end] != '\n') {
                end++;
            }
            lineNumber++;
            boolean last = end >= chars.length;
            int from = start;
            while (from < end && Character.isWhitespace(chars[from])) {
                from++;
            }
            if (from < end) {
                try (JsonParser parser = MAPPER.getFactory().createParser(chars, from, end - from)) {
                    // As ObjectMapper.readTree reads a line: its first value, whatever follows it.
                    if (parser.nextToken() == null) {
                        throw new IOException("no JSON value");
                    }
                    collected.add(parser);
                } catch (IOException e) {
                    if (complete || !last) {
                        throw new UnreadableFileException("invalid", "Line " + lineNumber + " is not valid JSON");
                    }
                }
            }
            start = end + 1;
        }
    }

    private static void readArray(JsonParser parser, Collected collected) throws IOException {
        while (parser.nextToken() == JsonToken.START_OBJECT && collected.records < MAX_RECORDS) {
            collected.add(parser);
        }
    }

    /** Reads a top-level object; when one of its fields is an array of objects, those are the records. */
    private static String readObject(JsonParser parser, Collected collected) throws IOException {
        while (parser.nextToken() == JsonToken.FIELD_NAME) {
            String name = parser.currentName();
            JsonToken value = parser.nextToken();
            if (value == JsonToken.START_ARRAY) {
                JsonToken next = parser.nextToken();
                if (next == JsonToken.START_OBJECT) {
                    collected.add(parser);
                    readArray(parser, collected);
                    return name;
                }
                if (next != JsonToken.END_ARRAY) {
                    parser.skipChildren();
                    while (parser.nextToken() != JsonToken.END_ARRAY) {
                        parser.skipChildren();
                    }
                }
            } else {
                parser.skipChildren();
            }
        }
        return null;
    }

    private static Reading reading(String format, Collected collected, Sample sample, Map<String, Object> extra) {
        List<ColumnDef> columns = new ArrayList<>();
        Map<String, Object> details = new LinkedHashMap<>();
        List<Map<String, Object>> fields = new ArrayList<>();
        for (Field field : collected.fields.values()) {
            List<String> types = field.typeNames();
            boolean nullable = types.contains("null") || field.seen < collected.records;
            List<String> present = types.stream().filter(t -> !t.equals("null")).toList();
            String type = present.size() == 1 ? present.get(0) : present.isEmpty() ? "text" : "mixed";
            columns.add(new ColumnDef(field.path, type, nullable));
            fields.add(Map.of("path", field.path, "types", types));
        }
        details.put("fields", fields);
        if (extra != null) {
            details.putAll(extra);
        }
        boolean exact = sample.complete() && collected.records < MAX_RECORDS;
        long count = exact ? collected.records
                : Math.max(collected.records, Math.round((double) sample.size() / Math.max(1, sample.head().length) * collected.records));
        return new Reading(format, DatasetKind.FILE, columns, count, exact, details);
    }

    /** JSON value types in alphabetical order, the order a field's types are listed in; bit i is TYPES[i]. */
    private static final String[] TYPES = {"boolean", "date", "decimal", "integer", "null", "text", "timestamp"};
    private static final int BOOLEAN = 0;
    private static final int DATE = 1;
    private static final int DECIMAL = 2;
    private static final int INTEGER = 3;
    private static final int NULL = 4;
    private static final int TEXT = 5;
    private static final int TIMESTAMP = 6;

    /** One field path: the JSON types seen at it and in how many records it occurs. */
    private static final class Field {
        final String path;
        int types;
        int seen;
        int lastRecord = -1;

        Field(String path) {
            this.path = path;
        }

        List<String> typeNames() {
            List<String> names = new ArrayList<>(2);
            for (int i = 0; i < TYPES.length; i++) {
                if ((types & 1 << i) != 0) {
                    names.add(TYPES[i]);
                }
            }
            return names;
        }
    }

    /**
     * A path prefix in the tree of paths met so far. Records of one file repeat the same paths, so each
     * path string is built once and its field found once, not per record.
     */
    private static final class PathNode {
        final String path;
        private Map<String, PathNode> children;
        private PathNode elements;
        Field leaf;

        PathNode(String path) {
            this.path = path;
        }

        PathNode child(String key) {
            if (children == null) {
                children = new java.util.HashMap<>();
            }
            // Looked up before it is made: a capturing lambda per field of every record was a tenth of the
            // allocation of reading JSON.
            PathNode child = children.get(key);
            if (child == null) {
                child = new PathNode(path.isEmpty() ? key : path + "." + key);
                children.put(key, child);
            }
            return child;
        }

        PathNode elements() {
            if (elements == null) {
                elements = new PathNode(path + "[]");
            }
            return elements;
        }
    }

    /**
     * Field paths and their JSON types across the records read so far, walked off the token stream
     * (no tree per record). A record's notes are kept back until the record has parsed to its end, so a
     * record cut off by the end of a sample adds nothing, as when each record was read into a tree first.
     */
    private static final class Collected {
        /** The fields of the records added, in the order their paths were first met. */
        final Map<String, Field> fields = new LinkedHashMap<>();
        /** Every path met, also in a record that failed to parse. */
        private final Map<String, Field> byPath = new java.util.HashMap<>();
        private final PathNode root = new PathNode("");
        private final List<Field> pendingFields = new ArrayList<>();
        private final List<Integer> pendingTypes = new ArrayList<>();
        int records;

        /** Adds the value whose first token the parser is on, leaving the parser on its last token. */
        void add(JsonParser parser) throws IOException {
            pendingFields.clear();
            pendingTypes.clear();
            walk(parser, root);
            for (int i = 0; i < pendingFields.size(); i++) {
                Field field = pendingFields.get(i);
                fields.putIfAbsent(field.path, field);
                field.types |= 1 << pendingTypes.get(i);
                if (field.lastRecord != records) {
                    field.lastRecord = records;
                    field.seen++;
                }
            }
            records++;
        }

        private void walk(JsonParser parser, PathNode node) throws IOException {
            JsonToken token = parser.currentToken();
            if (token == JsonToken.START_OBJECT) {
                while (parser.nextToken() == JsonToken.FIELD_NAME) {
                    PathNode child = node.child(parser.currentName());
                    parser.nextToken();
                    walk(parser, child);
                }
                return;
            }
            if (token == JsonToken.START_ARRAY) {
                PathNode elements = node.elements();
                if (parser.nextToken() == JsonToken.END_ARRAY) {
                    note(elements, NULL);
                    return;
                }
                do {
                    walk(parser, elements);
                } while (parser.nextToken() != JsonToken.END_ARRAY);
                return;
            }
            note(node, typeOf(parser, token));
        }

        private void note(PathNode node, int type) {
            if (node.leaf == null) {
                String path = node.path.isEmpty() ? "value" : node.path;
                node.leaf = byPath.computeIfAbsent(path, Field::new);
            }
            pendingFields.add(node.leaf);
            pendingTypes.add(type);
        }

        private static int typeOf(JsonParser parser, JsonToken token) throws IOException {
            return switch (token) {
                case VALUE_NULL -> NULL;
                case VALUE_TRUE, VALUE_FALSE -> BOOLEAN;
                case VALUE_NUMBER_INT -> INTEGER;
                case VALUE_NUMBER_FLOAT -> DECIMAL;
                // Inside JSON a quoted "12" is still a string; only ISO-8601 dates and times are read out of strings.
                case VALUE_STRING -> switch (isoTemporal(parser.getText())) {
                    case "date" -> DATE;
                    case "timestamp" -> TIMESTAMP;
                    default -> TEXT;
                };
                default -> throw new IOException("unexpected token " + token);
            };
        }
    }


    /**
     * {@code date} or {@code timestamp} for ISO-8601 text as {@code DateTimeFormatter.ISO_LOCAL_DATE} and
     * {@code ISO_DATE_TIME} read it, else {@code text}. Checked by hand, character by character: JSON files
     * hold a string in almost every record, and parsing each with java.time (which throws on a miss) took a
     * fifth of a harvest. {@code JsonTemporalTest} holds it to java.time on generated strings.
     */
    static String isoTemporal(String text) {
        int n = text.length();
        if (n < 10 || n > 40 || !digits(text, 0, 4) || text.charAt(4) != '-' || !digits(text, 5, 2) || text.charAt(7) != '-'
                || !digits(text, 8, 2)) {
            return "text";
        }
        int year = number(text, 0, 4);
        int month = number(text, 5, 2);
        int day = number(text, 8, 2);
        if (month < 1 || month > 12 || day < 1 || day > java.time.YearMonth.of(year, month).lengthOfMonth()) {
            return "text";
        }
        if (n == 10) {
            return "date";
        }
        if (text.charAt(10) != 'T' || n < 16 || !digits(text, 11, 2) || text.charAt(13) != ':' || !digits(text, 14, 2)
                || number(text, 11, 2) > 23 || number(text, 14, 2) > 59) {
            return "text";
        }
        int i = 16;
        if (i < n && text.charAt(i) == ':') {
            if (i + 3 > n || !digits(text, i + 1, 2) || number(text, i + 1, 2) > 59) {
                return "text";
            }
            i += 3;
            if (i < n && text.charAt(i) == '.') {
                int start = ++i;
                while (i < n && Character.isDigit(text.charAt(i)) && text.charAt(i) < 128) {
                    i++;
                }
                if (i - start > 9) { // java.time accepts "10:15:30." with no digits, and up to nine
                    return "text";
                }
            }
        }
        if (i < n && text.charAt(i) == 'Z') {
            i++;
        } else if (i < n && (text.charAt(i) == '+' || text.charAt(i) == '-')) {
            // An offset: +HH:MM, optionally :SS, at most 18 hours (ZoneOffset's range).
            if (i + 6 > n || !digits(text, i + 1, 2) || text.charAt(i + 3) != ':' || !digits(text, i + 4, 2)
                    || number(text, i + 1, 2) > 18 || number(text, i + 4, 2) > 59) {
                return "text";
            }
            int seconds = number(text, i + 1, 2) * 3600 + number(text, i + 4, 2) * 60;
            i += 6;
            if (i < n && text.charAt(i) == ':') {
                if (i + 3 > n || !digits(text, i + 1, 2) || number(text, i + 1, 2) > 59) {
                    return "text";
                }
                seconds += number(text, i + 1, 2);
                i += 3;
            }
            if (seconds > 18 * 3600) {
                return "text";
            }
        }
        return i == n ? "timestamp" : "text";
    }

    private static boolean digits(String text, int from, int count) {
        for (int i = from; i < from + count; i++) {
            char c = text.charAt(i);
            if (c < '0' || c > '9') {
                return false;
            }
        }
        return true;
    }

    private static int number(String text, int from, int count) {
        int value = 0;
        for (int i = from; i < from + count; i++) {
            value = value * 10 + (text.charAt(i) - '0');
        }
        return value;
    }
}
