package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.List;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;

class SniffCommandTest {

    private static JsonNode sniff(String... relative) throws Exception {
        List<String> args = new ArrayList<>(List.of("sniff", "--json"));
        for (String r : relative) {
            args.add(Workspaces.demo().resolve(r).toString());
        }
        StringWriter out = new StringWriter();
        int exit = Main.run(new PrintWriter(out, true), new PrintWriter(new StringWriter(), true), args.toArray(String[]::new));
        assertThat(exit).isZero();
        return new ObjectMapper().readTree(out.toString());
    }

    @Test
    void everyResultHasTheSameKeysInTheDocumentedOrder() throws Exception {
        JsonNode results = sniff("lab/nitrate_results_2025.csv", "bulletin/figures/fig1_no3_trend.png");
        for (JsonNode r : results) {
            List<String> keys = new ArrayList<>();
            r.fieldNames().forEachRemaining(keys::add);
            assertThat(keys).containsExactly("path", "format", "encoding", "bom", "delimiter", "quote", "escape",
                    "line_terminator", "header", "skip_lines", "footer_lines", "decimal_separator",
                    "thousands_separator", "columns", "row_count", "row_count_exact", "fields", "records_path",
                    "record_count", "error");
        }
    }

    @Test
    void readsTheDemoLabExportsAsTheirWritersWroteThem() throws Exception {
        // expected: the dialects the demo's files were written in (Python's csv module, see the workspace
        // README): a Latin-1 CRLF comma file with quoted cells, a semicolon file with decimal commas, a
        // tab-separated .txt.
        JsonNode r = sniff("lab/conductivity_legacy_2025.csv", "lab/ion_chromatograph_2025.csv",
                "lab/turbidity_bench_2025.txt", "field/probe_log.ndjson", "field/sampling_visits_2025-03.json",
                "bulletin/figures/fig3_ion_balance.pdf", "README.md");
        JsonNode latin = r.get(0);
        assertThat(latin.get("format").asText()).isEqualTo("csv");
        assertThat(latin.get("encoding").asText()).isEqualTo("iso-8859-1");
        assertThat(latin.get("line_terminator").asText()).isEqualTo("crlf");
        assertThat(latin.get("delimiter").asText()).isEqualTo(",");
        assertThat(latin.get("columns").get(3).get("name").asText()).isEqualTo("conductivity_µS/cm");
        assertThat(latin.get("row_count").asInt()).isEqualTo(24);
        JsonNode semicolon = r.get(1);
        assertThat(semicolon.get("delimiter").asText()).isEqualTo(";");
        assertThat(semicolon.get("decimal_separator").asText()).isEqualTo(",");
        assertThat(semicolon.get("columns").get(3).get("type").asText()).isEqualTo("decimal");
        assertThat(semicolon.get("columns").get(2).get("type").asText()).isEqualTo("date");
        assertThat(r.get(2).get("format").asText()).isEqualTo("csv");
        assertThat(r.get(2).get("delimiter").asText()).isEqualTo("\t");
        assertThat(r.get(3).get("format").asText()).isEqualTo("ndjson");
        assertThat(r.get(3).get("record_count").asInt()).isEqualTo(56);
        assertThat(r.get(4).get("format").asText()).isEqualTo("json");
        assertThat(r.get(4).get("record_count").asInt()).isEqualTo(16);
        assertThat(r.get(5).get("format").asText()).isEqualTo("pdf");
        assertThat(r.get(6).get("format").asText()).isEqualTo("text");
    }
}
