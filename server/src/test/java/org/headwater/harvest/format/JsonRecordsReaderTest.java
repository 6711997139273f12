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
}
