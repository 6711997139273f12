package org.headwater.lineage;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.headwater.store.LabelReader;
import org.headwater.store.LabelReader.DatasetLabel;

/**
 * The answer to "what is upstream / downstream of this dataset or column?": every dataset or column
 * reached, nearest first, each with the path that connects it to the target.
 *
 * @param startInCycle whether the walk came back to the target (a script that rewrites its own input)
 */
public record Neighbours(Target target, String direction, int count, boolean startInCycle, List<Neighbour> results) {

    /**
     * One dataset or column reached.
     *
     * @param column the column, or null when a dataset (or a dataset as a whole, from a column) was reached
     * @param indirect reached only through filters, joins or groupings: the target decides which rows it
     *     holds, not its values
     */
    public record Neighbour(long id, String name, String kind, String column, int distance, boolean indirect,
            List<Step> path) {
    }

    /** Walks {@code graph} (the live one, or one loaded as of an instant) from {@code target}. */
    public static Neighbours of(LineageGraph graph, LabelReader labels, Target target, boolean upstream, Query query) {
        String direction = upstream ? "upstream" : "downstream";
        if (!target.namesColumn()) {
            DatasetReach reach = upstream ? graph.upstream(target.datasetId(), query)
                    : graph.downstream(target.datasetId(), query);
            List<Reached> all = reach.reached();
            PathLabels paths = PathLabels.forDatasets(labels, all);
            List<Neighbour> results = new ArrayList<>();
            for (Reached r : all) {
                DatasetLabel label = paths.dataset(r.datasetId());
                results.add(new Neighbour(r.datasetId(), label.name(), label.kind(), null, r.distance(), false,
                        paths.steps(r.path())));
            }
            return new Neighbours(target, direction, results.size(), reach.startInCycle(), results);
        }
        ColumnClosure closure = upstream ? graph.upstreamColumns(target.datasetId(), target.column(), query)
                : graph.downstreamColumns(target.datasetId(), target.column(), query);
        List<ReachedColumn> flows = closure.flows().reached();
        List<ReachedColumn> indirect = closure.indirect().reached();
        PathLabels paths = PathLabels.forColumns(labels, flows, indirect);
        List<Neighbour> results = new ArrayList<>();
        for (boolean isIndirect : new boolean[] {false, true}) {
            for (ReachedColumn r : isIndirect ? indirect : flows) {
                DatasetLabel label = paths.dataset(r.column().datasetId());
                results.add(new Neighbour(label.id(), label.name(), label.kind(), r.column().column(), r.distance(),
                        isIndirect, paths.columnSteps(r.path())));
            }
        }
        results.sort(java.util.Comparator.comparingInt(Neighbour::distance));
        return new Neighbours(target, direction, results.size(),
                closure.flows().startInCycle() || closure.indirect().startInCycle(), results);
    }
}
