package org.headwater.lineage;

import java.util.Objects;
import org.headwater.model.DatasetKind;

/** The facts of a dataset's identity row that the graph keeps: its kind and the source that harvests it. */
public record DatasetRow(long id, DatasetKind kind, Long sourceId) {
    public DatasetRow {
        Objects.requireNonNull(kind, "kind");
    }
}
