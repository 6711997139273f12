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
import org.headwater.store.Views.PartitionView;
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

        // Every file is either a dataset of its own or a partition of a set; compare file by file.
        Map<String, Shape> actual = new TreeMap<>();
        List<String> sets = new ArrayList<>();
        int partitions = 0;
        try (Catalog catalog = Catalog.open(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            assertThat(summary.errors()).isZero();
            for (DatasetSummary d : catalog.reader().datasets(null, 0, 1000, null)) {
                if (!d.uri().startsWith("file:")) {
                    continue; // tables and views that sql/views.sql defines: no files of their own
                }
                DatasetView view = catalog.reader().dataset(d.id(), null).orElseThrow();
                if (view.kind().equals("file_set")) {
                    sets.add(view.name());
                    for (PartitionView p : view.partitions()) {
                        partitions++;
                        actual.put(p.name(), new Shape(p.columns().stream().map(c -> c.name()).toList(), p.rowCount()));
                    }
                } else {
                    actual.put(d.name(), new Shape(view.columns().stream().map(c -> c.name()).toList(), view.rowCount()));
                }
            }
            assertThat(summary.datasets()).isEqualTo(expected.size() - partitions + sets.size());
        }
        assertThat(actual).isEqualTo(expected);
        // expected sets: the demo's monthly station readings (key=value folders) and the two monthly field
        // exports named by month (see examples/quillwater-lab/README.md).
        assertThat(sets).containsExactly("field/sampling_visits_*.json", "stations/readings/year=*/month=*/readings.csv");
        assertThat(partitions).isEqualTo(8);
    }
}
