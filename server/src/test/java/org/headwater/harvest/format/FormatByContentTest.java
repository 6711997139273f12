package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import org.headwater.model.ColumnDef;
import org.junit.jupiter.api.Test;

/** The standard registry sends a file to the reader of what it holds, whatever its name says. */
class FormatByContentTest {
    private final FormatRegistry registry = FormatRegistry.standard();

    private Reading read(String name, String content) throws Exception {
        byte[] bytes = content.getBytes(StandardCharsets.UTF_8);
        return registry.read(new Sample(name, bytes, true, bytes.length));
    }

    @Test
    void ndjsonInATxtFileIsReadAsRecordsNotAsACommaSeparatedTable() throws Exception {
        // NDJSON: one JSON text per line, RFC 8259 texts separated by LF (ndjson.org spec 1.0, section 3).
        Reading r = read("gauge_feed.txt", "{\"gauge\":\"G-1\",\"depth_cm\":41}\n{\"gauge\":\"G-2\",\"depth_cm\":39}\n");
        assertThat(r.format()).isEqualTo("ndjson");
        assertThat(r.columns()).extracting(ColumnDef::name).containsExactly("gauge", "depth_cm");
        assertThat(r.rowCount()).isEqualTo(2L);
    }

    @Test
    void aJsonArrayWithoutExtensionAndAJsonObjectNamedDatAreJson() throws Exception {
        Reading array = read("export", "[{\"plot\":1,\"cover\":0.4},{\"plot\":2,\"cover\":0.7}]");
        assertThat(array.format()).isEqualTo("json");
        assertThat(array.rowCount()).isEqualTo(2L);
        Reading holder = read("survey.dat", "\uFEFF  {\"version\": 2, \"rows\": [{\"plot\": 1}, {\"plot\": 2}, {\"plot\": 3}]}");
        assertThat(holder.format()).isEqualTo("json");
        assertThat(holder.rowCount()).isEqualTo(3L);
    }

    @Test
    void aCsvWhoseHeaderStartsWithABracketStaysACsv() throws Exception {
        Reading r = read("units.csv", "[unit],value\nmg/L,4.2\nmg/L,3.9\n");
        assertThat(r.format()).isEqualTo("csv");
        assertThat(r.columns()).extracting(ColumnDef::name).containsExactly("[unit]", "value");
    }

    @Test
    void aCsvFileThatHoldsJsonIsJson() throws Exception {
        Reading r = read("mislabelled.csv", "[{\"a\": 1}, {\"a\": 2}]");
        assertThat(r.format()).isEqualTo("json");
    }
}
