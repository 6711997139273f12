package org.headwater.testing;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;

/** Finding datasets of a harvested catalog by URI, for harvest tests. */
public final class DatasetLookup {
    private DatasetLookup() {
    }

    /** The dataset with exactly this URI; fails the test when there is none. */
    public static DatasetView dataset(Catalog catalog, String uri) {
        List<DatasetSummary> found = catalog.reader().findDatasets(uri);
        assertThat(found).as(uri).extracting(DatasetSummary::uri).contains(uri);
        long id = found.stream().filter(d -> d.uri().equals(uri)).findFirst().orElseThrow().id();
        return catalog.reader().dataset(id, null).orElseThrow();
    }

    /** The present datasets whose URI starts with the prefix, by the rest of their URI, sorted. */
    public static List<String> datasetNames(Catalog catalog, String prefix) {
        List<String> names = new ArrayList<>();
        for (DatasetSummary d : catalog.reader().datasets(null, 0, 1000, null)) {
            if (d.uri().startsWith(prefix) && d.present()) {
                names.add(d.uri().substring(prefix.length()));
            }
        }
        names.sort(null);
        return names;
    }

    /** Each column as {@code name type}. */
    public static List<String> columns(DatasetView d) {
        List<String> out = new ArrayList<>();
        for (ColumnView c : d.columns()) {
            out.add(c.name() + " " + c.type());
        }
        return out;
    }
}
