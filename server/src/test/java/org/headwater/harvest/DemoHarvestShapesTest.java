package org.headwater.harvest;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.headwater.Catalog;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.Python;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoHarvestShapesTest {

    @TempDir
    Path temp;

    /** A dataset's shape: its column names and its row or record count. */
    record Shape(List<String> columns, Long rows) {
    }

    @Test
    void harvestOfTheDemoYieldsTheDatasetsAndColumnsTheFilesHold() throws Exception {
        Python.requireAvailable();
        // expected shapes: Python's standard csv and json modules reading the same files
        // (src/test/resources/reference/demo_shapes.py), not Headwater's readers.
        Path reference = Path.of(getClass().getResource("/reference/demo_shapes.py").toURI());
        JsonNode expectedJson = new ObjectMapper().readTree(Python.run(reference, Workspaces.demo().toString()));
        Map<String, Shape> expected = new TreeMap<>();
        for (Iterator<Map.Entry<String, JsonNode>> it = expectedJson.fields(); it.hasNext(); ) {
            var e = it.next();
            List<String> columns = new ArrayList<>();
            e.getValue().get("columns").forEach(c -> columns.add(c.asText()));
            JsonNode rows = e.getValue().get("rows");
            expected.put(e.getKey(), new Shape(columns, rows.isNull() ? null : rows.asLong()));
        }

        Map<String, Shape> actual = new TreeMap<>();
        int totalColumns = 0;
        try (Catalog catalog = Catalog.open(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            assertThat(summary.errors()).isZero();
            assertThat(summary.datasets()).isEqualTo(expected.size());
            for (DatasetSummary d : catalog.reader().datasets(null, 0, 1000, null)) {
                DatasetView view = catalog.reader().dataset(d.id(), null).orElseThrow();
                List<String> names = view.columns().stream().map(c -> c.name()).toList();
                totalColumns += names.size();
                actual.put(d.name(), new Shape(names, view.rowCount()));
            }
        }
        assertThat(actual).isEqualTo(expected);
        assertThat(totalColumns).isEqualTo(expected.values().stream().mapToInt(s -> s.columns().size()).sum());
    }
}
