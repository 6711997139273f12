package org.headwater.lineage;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.headwater.store.CatalogReader;
import org.headwater.store.Views.ColumnFlowView;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.EdgeView;

/**
 * The direct lineage of one dataset, for {@code headwater lineage} and {@code /api/lineage}: its upstream
 * and downstream neighbours with evidence, and, per column, the source columns it comes from (copied or
 * computed) and the columns that only filter, join or group the rows it holds.
 */
public final class LineageReport {
    private LineageReport() {
    }

    /** Where a column's values come from. */
    public record Origin(String dataset, String column, boolean derived) {
    }

    /** A column that decides which rows there are, without giving values. */
    public record Influence(String dataset, String column) {
    }

    /** One column with its origins. */
    public record ColumnLineage(String name, int ordinal, List<Origin> origins, List<Influence> influencing) {
    }

    /** Dataset-level neighbours and column-level origins. */
    public record Report(String dataset, List<EdgeView> upstream, List<EdgeView> downstream, List<ColumnLineage> columns) {
    }

    public static Report of(CatalogReader reader, DatasetView dataset) {
        List<ColumnFlowView> flows = reader.columnFlowsInto(dataset.id());
        Set<Influence> influencing = new LinkedHashSet<>();
        for (ColumnFlowView f : flows) {
            if (f.role().equals("influencing")) {
                influencing.add(new Influence(f.sourceDataset(), f.sourceColumn()));
            }
        }
        List<ColumnLineage> columns = new ArrayList<>();
        for (ColumnView c : dataset.columns()) {
            Set<Origin> origins = new LinkedHashSet<>();
            for (ColumnFlowView f : flows) {
                if (c.name().equals(f.targetColumn()) && !f.role().equals("influencing")) {
                    origins.add(new Origin(f.sourceDataset(), f.sourceColumn(), f.role().equals("derived")));
                }
            }
            columns.add(new ColumnLineage(c.name(), c.ordinal(), List.copyOf(origins), List.copyOf(influencing)));
        }
        return new Report(dataset.name(), dataset.upstream(), dataset.downstream(), columns);
    }
}
