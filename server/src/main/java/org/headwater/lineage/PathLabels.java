package org.headwater.lineage;

import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.headwater.store.LabelReader;
import org.headwater.store.LabelReader.DatasetLabel;

/** Dataset and script names for a set of paths, looked up in two queries, and steps written with them. */
public final class PathLabels {
    private final Map<Long, DatasetLabel> datasets;
    private final Map<Long, String> scripts;

    private PathLabels(Map<Long, DatasetLabel> datasets, Map<Long, String> scripts) {
        this.datasets = datasets;
        this.scripts = scripts;
    }

    public static PathLabels forDatasets(LabelReader labels, List<Reached> reached) {
        Set<Long> datasetIds = new HashSet<>();
        Set<Long> scriptIds = new HashSet<>();
        for (Reached r : reached) {
            datasetIds.add(r.datasetId());
            for (Hop h : r.path()) {
                datasetIds.add(h.fromDatasetId());
                datasetIds.add(h.toDatasetId());
                if (h.scriptId() != null) {
                    scriptIds.add(h.scriptId());
                }
            }
        }
        return new PathLabels(labels.datasets(datasetIds), labels.scripts(scriptIds));
    }

    @SafeVarargs
    public static PathLabels forColumns(LabelReader labels, List<ReachedColumn>... lists) {
        Set<Long> datasetIds = new HashSet<>();
        Set<Long> scriptIds = new HashSet<>();
        for (List<ReachedColumn> list : lists) {
            for (ReachedColumn r : list) {
                datasetIds.add(r.column().datasetId());
                for (ColumnHop h : r.path()) {
                    datasetIds.add(h.from().datasetId());
                    datasetIds.add(h.to().datasetId());
                    if (h.scriptId() != null) {
                        scriptIds.add(h.scriptId());
                    }
                }
            }
        }
        return new PathLabels(labels.datasets(datasetIds), labels.scripts(scriptIds));
    }

    public static PathLabels of(LabelReader labels, Set<Long> datasetIds, Set<Long> scriptIds) {
        return new PathLabels(labels.datasets(datasetIds), labels.scripts(scriptIds));
    }

    public DatasetLabel dataset(long id) {
        DatasetLabel label = datasets.get(id);
        return label != null ? label : new DatasetLabel(id, "#" + id, null, "unknown");
    }

    public String script(Long id) {
        return id == null ? null : scripts.getOrDefault(id, "#" + id);
    }

    public Step step(Hop h) {
        return new Step(h.edgeId(), dataset(h.fromDatasetId()).name(), null, dataset(h.toDatasetId()).name(), null,
                null, script(h.scriptId()), h.runId(), h.evidence().word(), h.confidence());
    }

    public Step step(ColumnHop h) {
        return new Step(h.edgeId(), dataset(h.from().datasetId()).name(), h.from().column(),
                dataset(h.to().datasetId()).name(), h.to().column(), h.role().name().toLowerCase(Locale.ROOT),
                script(h.scriptId()), h.runId(), h.evidence().word(), h.confidence());
    }

    public List<Step> steps(List<Hop> hops) {
        return hops.stream().map(this::step).toList();
    }

    public List<Step> columnSteps(List<ColumnHop> hops) {
        return hops.stream().map(this::step).toList();
    }
}
