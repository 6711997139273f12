package org.headwater.cli;

import java.util.List;
import org.headwater.store.CatalogReader;
import org.headwater.store.Views.DatasetSummary;

/** Finds the one dataset a person means by a name, path or URI, or says plainly why there is none. */
final class DatasetKeys {
    private DatasetKeys() {
    }

    static DatasetSummary one(CatalogReader reader, String key) {
        List<DatasetSummary> found = reader.findDatasets(key);
        if (found.isEmpty()) {
            throw new Problems.UsageProblem("no dataset matches '" + key + "'; try 'headwater search " + key + "'");
        }
        DatasetSummary first = found.get(0);
        if (found.size() > 1 && !first.name().equals(key) && !first.uri().equals(key)) {
            StringBuilder list = new StringBuilder("'" + key + "' matches " + found.size() + " datasets:");
            found.forEach(d -> list.append("\n  ").append(d.name()));
            throw new Problems.UsageProblem(list.toString());
        }
        return first;
    }
}
