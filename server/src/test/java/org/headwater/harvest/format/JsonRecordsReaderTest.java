package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import org.headwater.model.ColumnDef;
import org.junit.jupiter.api.Test;

class JsonRecordsReaderTest {
    private final JsonRecordsReader reader = new JsonRecordsReader();

    private static Sample whole(String name, String text) {
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        return new Sample(name, bytes, true, bytes.length);
    }

    @Test
    void anArrayOfRecordsGivesDottedPathsTypesAndOptionalFields() throws Exception {
        // JSON value types per RFC 8259 section 3; a field absent from one record is optional.
        Reading r = reader.read(whole("visits.json",
                "[{\"id\": 1, \"gps\": {\"lat\": 47.2, \"lon\": -32.5}, \"tags\": [\"a\"], \"note\": \"x\"},"
                        + " {\"id\": 2, \"gps\": {\"lat\": 47.3, \"lon\": -32.6}, \"tags\": []}]"));
        assertThat(r.format()).isEqualTo("json");
        assertThat(r.rowCount()).isEqualTo(2L);
        assertThat(r.rowCountExact()).isTrue();
        assertThat(r.columns()).containsExactly(
                new ColumnDef("id", "integer", false),
                new ColumnDef("gps.lat", "decimal", false),
                new ColumnDef("gps.lon", "decimal", false),
                new ColumnDef("tags[]", "text", true),
                new ColumnDef("note", "text", true));
    }

    @Test
    void anObjectHoldingARecordsArrayNamesTheKeyThatHoldsIt() throws Exception {
        Reading r = reader.read(whole("export.json", "{\"exported\": \"2026-01-01\", \"rows\": [{\"a\": true}, {\"a\": 1}]}"));
        assertThat(r.details()).containsEntry("records_path", "rows");
        assertThat(r.columns()).containsExactly(new ColumnDef("a", "mixed", false));
        @SuppressWarnings("unchecked")
        List<Map<String, Object>> fields = (List<Map<String, Object>>) r.details().get("fields");
        assertThat(fields.get(0).get("types")).isEqualTo(List.of("boolean", "integer"));
    }

    @Test
    void ndjsonIsOneRecordPerLine() throws Exception {
        Reading r = reader.read(whole("log.ndjson", "{\"t\": \"2026-01-01T10:00:00Z\", \"v\": 1.5}\n{\"t\": \"2026-01-01T11:00:00Z\", \"v\": 2}\n"));
        assertThat(r.format()).isEqualTo("ndjson");
        assertThat(r.rowCount()).isEqualTo(2L);
        assertThat(r.columns()).containsExactly(new ColumnDef("t", "timestamp", false), new ColumnDef("v", "mixed", false));
    }

    @Test
    void linesAreReadAsNdjsonOnlyWhenTheFirstLineClosesAnObjectAndAnotherOpensAfterIt() throws Exception {
        // NDJSON: one JSON text per line (the ndjson-spec, "Newline Delimited JSON"); blank lines and spaces
        // around the objects are whitespace. A pretty-printed object is one JSON text (RFC 8259), not lines.
        assertThat(reader.read(whole("a.ndjson", "{\"a\": 1}  \r\n\n  \t{\"a\": 2}\n")).format()).isEqualTo("ndjson");
        assertThat(reader.read(whole("b.json", "{\"a\": 1}\n   \n")).format()).isEqualTo("json");
        assertThat(reader.read(whole("c.json", "{\n  \"rows\": [{\"a\": 1}]\n}\n")).format()).isEqualTo("json");
        assertThat(reader.read(whole("d.json", "{\"rows\": [{\"a\": 1}]} \n[1]")).format()).isEqualTo("json");
    }

    @Test
    void invalidJsonIsAnErrorOnThatFileNotACrash() {
        assertThatThrownBy(() -> reader.read(whole("bad.json", "[{\"a\": 1}, {\"a\": ")))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessageStartingWith("Invalid JSON:")
                .extracting(e -> ((UnreadableFileException) e).kind()).isEqualTo("invalid");
        assertThatThrownBy(() -> reader.read(whole("bad.ndjson", "{\"a\": 1}\nnot json\n")))
                .isInstanceOf(UnreadableFileException.class)
                .hasMessage("Line 2 is not valid JSON");
    }

    @Test
    void aSampleCutInsideARecordKeepsTheRecordsBeforeTheCutAndEstimatesTheCount() throws Exception {
        String text = "[{\"a\": 1}, {\"a\": 2}, {\"a\": 3}, {\"a\"";
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        Reading r = reader.read(new Sample("big.json", bytes, false, bytes.length * 10L));
        assertThat(r.rowCountExact()).isFalse();
        assertThat(r.rowCount()).isEqualTo(30L);
        assertThat(r.columns()).containsExactly(new ColumnDef("a", "integer", false));
    }

    @Test
    void pathsTypesAndOptionalFieldsAgreeWithAWalkOfJacksonsTreeModelOnGeneratedRecords() throws Exception {
        // expected paths and types: a walk of Jackson's own JsonNode tree (ObjectMapper.readTree), the
        // general-purpose reference; record shapes generated from a fixed seed.
        java.util.Random random = new java.util.Random(20261202L);
        com.fasterxml.jackson.databind.ObjectMapper mapper = new com.fasterxml.jackson.databind.ObjectMapper();
        for (int file = 0; file < 40; file++) {
            StringBuilder ndjson = new StringBuilder();
            List<String> records = new java.util.ArrayList<>();
            for (int n = 0; n < 1 + random.nextInt(30); n++) {
                String record = randomObject(random, 0);
                records.add(record);
                ndjson.append(record).append('\n');
            }
            Map<String, java.util.TreeSet<String>> types = new java.util.LinkedHashMap<>();
            Map<String, Integer> seen = new java.util.HashMap<>();
            for (String record : records) {
                java.util.Set<String> here = new java.util.HashSet<>();
                treeWalk("", mapper.readTree(record), types, here);
                here.forEach(p -> seen.merge(p, 1, Integer::sum));
            }
            List<ColumnDef> expected = new java.util.ArrayList<>();
            types.forEach((path, t) -> {
                java.util.TreeSet<String> present = new java.util.TreeSet<>(t);
                present.remove("null");
                String type = present.size() == 1 ? present.first() : present.isEmpty() ? "text" : "mixed";
                expected.add(new ColumnDef(path, type, t.contains("null") || seen.get(path) < records.size()));
            });
            Reading lines = reader.read(whole("f" + file + ".ndjson", ndjson.toString()));
            Reading array = reader.read(whole("f" + file + ".json", "[" + String.join(",", records) + "]"));
            assertThat(lines.columns()).as("file %d as NDJSON", file).isEqualTo(expected);
            assertThat(array.columns()).as("file %d as an array", file).isEqualTo(expected);
            assertThat(array.rowCount()).isEqualTo((long) records.size());
        }
    }

    private static final String[] KEYS = {"id", "site", "gps", "tags", "when", "level"};

    private static String randomObject(java.util.Random random, int depth) {
        StringBuilder b = new StringBuilder("{");
        int fields = random.nextInt(4);
        java.util.Set<String> used = new java.util.HashSet<>();
        for (int i = 0; i < fields; i++) {
            String key = KEYS[random.nextInt(KEYS.length)];
            if (!used.add(key)) {
                continue;
            }
            if (b.length() > 1) {
                b.append(',');
            }
            b.append('"').append(key).append("\":").append(randomValue(random, depth));
        }
        return b.append('}').toString();
    }

    private static String randomValue(java.util.Random random, int depth) {
        return switch (random.nextInt(depth < 2 ? 9 : 7)) {
            case 0 -> "null";
            case 1 -> random.nextBoolean() ? "true" : "false";
            case 2 -> Integer.toString(random.nextInt(1000) - 500);
            case 3 -> (random.nextInt(1000) / 10.0) + "";
            case 4 -> "\"2026-0" + (1 + random.nextInt(9)) + "-1" + random.nextInt(10) + "\"";
            case 5 -> "\"2026-03-04T05:06:07Z\"";
            case 6 -> "\"plain\"";
            case 7 -> randomObject(random, depth + 1);
            default -> {
                StringBuilder b = new StringBuilder("[");
                for (int i = 0, n = random.nextInt(3); i < n; i++) {
                    b.append(i > 0 ? "," : "").append(randomValue(random, depth + 1));
                }
                yield b.append(']').toString();
            }
        };
    }

    private static void treeWalk(String prefix, com.fasterxml.jackson.databind.JsonNode node,
            Map<String, java.util.TreeSet<String>> types, java.util.Set<String> here) {
        if (node.isObject()) {
            node.fields().forEachRemaining(f -> treeWalk(prefix.isEmpty() ? f.getKey() : prefix + "." + f.getKey(), f.getValue(), types, here));
            return;
        }
        if (node.isArray()) {
            if (node.isEmpty()) {
                types.computeIfAbsent(prefix + "[]", k -> new java.util.TreeSet<>()).add("null");
                here.add(prefix + "[]");
            }
            node.forEach(e -> treeWalk(prefix + "[]", e, types, here));
            return;
        }
        String path = prefix.isEmpty() ? "value" : prefix;
        String type = node.isNull() ? "null" : node.isBoolean() ? "boolean" : node.isIntegralNumber() ? "integer"
                : node.isNumber() ? "decimal" : JsonRecordsReader.isoTemporal(node.asText());
        types.computeIfAbsent(path, k -> new java.util.TreeSet<>()).add(type);
        here.add(path);
    }
}
