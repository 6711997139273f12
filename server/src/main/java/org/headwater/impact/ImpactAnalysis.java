package org.headwater.impact;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.impact.ImpactReport.Affected;
import org.headwater.impact.ImpactReport.Counts;
import org.headwater.impact.Why.Relation;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.lineage.ColumnClosure;
import org.headwater.lineage.ColumnHop;
import org.headwater.lineage.ColumnKey;
import org.headwater.lineage.DatasetReach;
import org.headwater.lineage.Hop;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.PathLabels;
import org.headwater.lineage.Query;
import org.headwater.lineage.Reached;
import org.headwater.lineage.ReachedColumn;
import org.headwater.lineage.Step;
import org.headwater.lineage.Target;
import org.headwater.store.LabelReader;
import org.headwater.store.OwnerReader;
import org.headwater.store.Views.OwnerView;

/**
 * Works out what a proposed change affects. The rules (also in DEVELOPERS.md, "Impact rules"):
 *
 * <ul>
 *   <li>A change to a column (drop, rename, retype) follows the column's lineage: columns copied or
 *       computed from it, transitively, are affected; columns reached only through a filter, join or
 *       grouping are affected indirectly. The datasets holding affected columns are affected, and every
 *       script whose code moves an affected column (or the target) into another affected column reads
 *       it. Python and R analysis does not trace filter and join columns, so a script that reads an
 *       affected column's dataset without a traced flow from that column is a reader when its code names
 *       the column (its output is affected, indirectly when the edge has other flows); when its code
 *       cannot be read and the edge has no flows at all, it and its output are listed as uncertain. A
 *       figure or view reached "as a whole" (a flow that names no target column) is affected as a whole.</li>
 *   <li>A change to a whole dataset (delete or move, late or stale) affects everything downstream of it
 *       by dataset edges, and every script on an edge between two of them (parallel edges included).</li>
 * </ul>
 *
 * Distances are hops along a shortest path; a script's distance is that of the output it writes.
 */
public final class ImpactAnalysis {
    private static final List<String> KIND_ORDER = List.of("dataset", "figure", "view", "column", "script");

    private final LineageGraph graph;
    private final LabelReader labels;
    private final OwnerReader owners;

    /** @param graph the graph to answer from: the live one, or one loaded as of an instant */
    public ImpactAnalysis(LineageGraph graph, LabelReader labels, OwnerReader owners) {
        this.graph = graph;
        this.labels = labels;
        this.owners = owners;
    }

    /** Everything a change affects, following every edge. */
    public ImpactReport report(Target target, ChangeKind change) {
        return report(target, change, Query.everything());
    }

    /**
     * Everything a change affects, following the edges {@code query}'s edge filters allow (its dataset
     * filters are not used: an impact report lists everything reached).
     *
     * @throws IllegalArgumentException when a column change names no column, or a dataset change names one
     */
    public ImpactReport report(Target target, ChangeKind change, Query query) {
        if (change.aboutColumn() && !target.namesColumn()) {
            throw new IllegalArgumentException(change.word() + " is a change to a column; name it as dataset.column");
        }
        if (!change.aboutColumn() && target.namesColumn()) {
            throw new IllegalArgumentException(change.word() + " is a change to a whole dataset; name the dataset"
                    + " without a column");
        }
        Query edges = Query.everything().withMaxDepth(query.maxDepth()).withEvidence(query.evidence())
                .withMinConfidence(query.minConfidence());
        Drafts drafts = new Drafts();
        if (target.namesColumn()) {
            drafts.startDataset = target.datasetId();
        }
        boolean cycle = target.namesColumn() ? columns(target, change, edges, drafts, new ScriptTexts(labels))
                : datasets(target, change, edges, drafts);
        return drafts.finish(target, change, cycle);
    }

    private boolean datasets(Target target, ChangeKind change, Query query, Drafts drafts) {
        long start = target.datasetId();
        DatasetReach reach = graph.downstream(start, query);
        Map<Long, Integer> distance = new HashMap<>();
        Map<Long, List<Hop>> paths = new HashMap<>();
        distance.put(start, 0);
        paths.put(start, List.of());
        for (Reached r : reach.reached()) {
            distance.put(r.datasetId(), r.distance());
            paths.put(r.datasetId(), r.path());
            drafts.dataset(r.datasetId(), r.distance(), false, false, Why.of(change, Relation.MADE_FROM), r.path());
        }
        for (Map.Entry<Long, Integer> from : new ArrayList<>(distance.entrySet())) {
            for (Hop hop : graph.edgesOut(from.getKey(), query)) {
                if (hop.scriptId() == null || !distance.containsKey(hop.toDatasetId())) {
                    continue;
                }
                Relation relation = from.getKey() == start ? Relation.READER : Relation.DOWNSTREAM_READER;
                drafts.script(hop.scriptId(), from.getValue() + 1, false, false, Why.of(change, relation),
                        append(paths.get(from.getKey()), hop));
            }
        }
        return reach.startInCycle();
    }

    /** How a column was reached: hops from the target, whether only through filters or joins, and the path. */
    private record Reach(int distance, boolean indirect, List<Object> path) {
        boolean beats(Reach other) {
            return other == null || distance < other.distance || (distance == other.distance && other.indirect && !indirect);
        }
    }

    private boolean columns(Target target, ChangeKind change, Query query, Drafts drafts, ScriptTexts texts) {
        ColumnKey start = new ColumnKey(target.datasetId(), target.column());
        Map<ColumnKey, Reach> reached = new LinkedHashMap<>();
        java.util.ArrayDeque<ColumnKey> fresh = new java.util.ArrayDeque<>();
        reached.put(start, new Reach(0, false, List.of()));
        fresh.add(start);
        boolean cycle = closure(start, reached.get(start), change, query, drafts, reached, fresh);
        while (!fresh.isEmpty()) {
            ColumnKey key = fresh.poll();
            Reach at = reached.get(key);
            Set<Long> traced = new HashSet<>();
            for (ColumnHop hop : graph.columnEdgesOut(key.datasetId(), key.column(), query)) {
                traced.add(hop.edgeId());
                if (hop.scriptId() != null && reached.containsKey(hop.to())) {
                    boolean rows = at.indirect() || hop.role() == ColumnRole.INFLUENCING;
                    drafts.script(hop.scriptId(), at.distance() + 1, rows, false, Why.of(change, Relation.READER),
                            append(at.path(), hop));
                }
            }
            // Edges with no traced flow from this column: the script may still use it (a filter the analysis
            // does not trace), which its code shows by naming the column.
            for (Hop hop : graph.edgesOut(key.datasetId(), query)) {
                if (traced.contains(hop.edgeId()) || hop.scriptId() == null) {
                    continue;
                }
                boolean noFlows = !graph.hasColumnFlows(hop.edgeId());
                java.util.Optional<Boolean> named = texts.names(hop.scriptId(), key.column());
                List<Object> path = append(at.path(), hop);
                int d = at.distance() + 1;
                if (named.orElse(false)) {
                    drafts.script(hop.scriptId(), d, at.indirect(), false, Why.of(change, Relation.NAMED), path);
                    drafts.dataset(hop.toDatasetId(), d, at.indirect() || !noFlows, false,
                            Why.of(change, Relation.NAMED_OUTPUT), path);
                    // What the script writes may depend on the column as a filter would: indirectly.
                    for (String written : graph.columnsWrittenBy(hop.edgeId())) {
                        ColumnKey out = new ColumnKey(hop.toDatasetId(), written);
                        Reach via = new Reach(d, true, path);
                        if (via.beats(reached.get(out))) {
                            record(out, via, change, drafts, reached, fresh);
                            cycle |= closure(out, via, change, query, drafts, reached, fresh) && out.equals(start);
                        }
                    }
                } else if (named.isEmpty() && noFlows) {
                    String why = Why.of(change, Relation.UNKNOWN_COLUMNS);
                    drafts.script(hop.scriptId(), d, at.indirect(), true, why, path);
                    drafts.dataset(hop.toDatasetId(), d, at.indirect(), true, why, path);
                }
            }
        }
        return cycle;
    }

    /** Records everything the column walk from {@code from} reaches; true when it comes back to {@code from}. */
    private boolean closure(ColumnKey from, Reach at, ChangeKind change, Query query, Drafts drafts,
            Map<ColumnKey, Reach> reached, java.util.ArrayDeque<ColumnKey> fresh) {
        ColumnClosure closure = graph.downstreamColumns(from.datasetId(), from.column(), query);
        for (boolean isIndirect : new boolean[] {false, true}) {
            for (ReachedColumn r : (isIndirect ? closure.indirect() : closure.flows()).reached()) {
                List<Object> path = new ArrayList<>(at.path());
                path.addAll(r.path());
                Reach via = new Reach(at.distance() + r.distance(), at.indirect() || isIndirect, path);
                if (via.beats(reached.get(r.column()))) {
                    record(r.column(), via, change, drafts, reached, fresh);
                }
            }
        }
        return closure.flows().startInCycle() || closure.indirect().startInCycle();
    }

    private void record(ColumnKey key, Reach via, ChangeKind change, Drafts drafts, Map<ColumnKey, Reach> reached,
            java.util.ArrayDeque<ColumnKey> fresh) {
        if (key.column() == null) {
            // A flow that names no column of its target (a figure drawn from it) affects the target as a whole.
            drafts.dataset(key.datasetId(), via.distance(), via.indirect(), false,
                    Why.of(change, via.indirect() ? Relation.ROWS : Relation.WHOLE), via.path());
            return;
        }
        reached.put(key, via);
        fresh.add(key);
        Object last = via.path().isEmpty() ? null : via.path().get(via.path().size() - 1);
        Relation relation = via.indirect() ? Relation.ROWS
                : last instanceof ColumnHop h && h.role() == ColumnRole.DIRECT ? Relation.COPY : Relation.COMPUTE;
        drafts.column(key, via.distance(), via.indirect(), Why.of(change, relation), via.path());
        drafts.dataset(key.datasetId(), via.distance(), via.indirect(), false, Why.of(change, Relation.HOLDER), via.path());
    }

    private static List<Object> append(List<?> path, Object hop) {
        List<Object> longer = new ArrayList<>(path);
        longer.add(hop);
        return longer;
    }

    /**
     * One affected thing before names and owners are looked up; the nearest, most direct reach wins. The
     * path holds {@link Hop}s and {@link ColumnHop}s: a column path may go on through a dataset edge.
     */
    private record Draft(String key, boolean script, long id, String column, int distance, boolean indirect,
            boolean uncertain, String why, List<?> path) {
        /** Whether this reach is better than {@code other}: nearer, else direct rather than indirect or uncertain. */
        boolean beats(Draft other) {
            if (distance != other.distance) {
                return distance < other.distance;
            }
            int mine = (indirect ? 1 : 0) + (uncertain ? 2 : 0);
            int theirs = (other.indirect ? 1 : 0) + (other.uncertain ? 2 : 0);
            return mine < theirs;
        }
    }

    /** The drafts of one report, then the report. */
    private final class Drafts {
        private final Map<String, Draft> byKey = new LinkedHashMap<>();
        /** Whether every reach of a dataset so far was indirect (a dataset is indirect only if all its reaches are). */
        private final Map<Long, Boolean> allIndirect = new HashMap<>();
        private long startDataset = -1;

        void dataset(long id, int distance, boolean indirect, boolean uncertain, String why, List<?> path) {
            if (id == startDataset) {
                return; // the target's own dataset is not "affected" by a change to one of its columns
            }
            allIndirect.merge(id, indirect, Boolean::logicalAnd);
            offer(new Draft("d" + id, false, id, null, distance, indirect, uncertain, why, path));
        }

        void column(ColumnKey key, int distance, boolean indirect, String why, List<?> path) {
            offer(new Draft("c" + key.datasetId() + "." + key.column(), false, key.datasetId(), key.column(), distance,
                    indirect, false, why, path));
        }

        void script(long id, int distance, boolean indirect, boolean uncertain, String why, List<?> path) {
            offer(new Draft("s" + id, true, id, null, distance, indirect, uncertain, why, path));
        }

        private void offer(Draft draft) {
            Draft before = byKey.get(draft.key());
            if (before == null || draft.beats(before)) {
                byKey.put(draft.key(), draft);
            }
        }

        ImpactReport finish(Target target, ChangeKind change, boolean cycle) {
            Set<Long> datasetIds = new HashSet<>();
            Set<Long> scriptIds = new HashSet<>();
            datasetIds.add(target.datasetId());
            for (Draft d : byKey.values()) {
                (d.script() ? scriptIds : datasetIds).add(d.id());
                for (Object step : d.path()) {
                    if (step instanceof Hop h) {
                        datasetIds.add(h.fromDatasetId());
                        datasetIds.add(h.toDatasetId());
                        if (h.scriptId() != null) {
                            scriptIds.add(h.scriptId());
                        }
                    } else if (step instanceof ColumnHop h) {
                        datasetIds.add(h.from().datasetId());
                        datasetIds.add(h.to().datasetId());
                        if (h.scriptId() != null) {
                            scriptIds.add(h.scriptId());
                        }
                    }
                }
            }
            PathLabels names = PathLabels.of(labels, datasetIds, scriptIds);
            Set<Long> ownedIds = new HashSet<>();
            byKey.values().stream().filter(d -> !d.script()).forEach(d -> ownedIds.add(d.id()));
            Map<Long, List<OwnerReader.Assigned>> assigned = owners.assigned(ownedIds, graph.asOf());
            Map<Long, List<String>> authors = owners.scriptAuthors(scriptIds);
            Map<Long, List<OwnerView>> suggested = new HashMap<>();

            List<Affected> affected = new ArrayList<>();
            for (Draft d : byKey.values()) {
                String kind;
                String name;
                List<OwnerView> who;
                boolean indirect = d.indirect();
                if (d.script()) {
                    kind = "script";
                    name = names.script(d.id());
                    who = authors.getOrDefault(d.id(), List.of()).stream()
                            .map(a -> new OwnerView(a, "person", "changed this script (git history)", "git", false, true))
                            .toList();
                } else {
                    String datasetKind = names.dataset(d.id()).kind();
                    kind = d.column() != null ? "column"
                            : datasetKind.equals("figure") || datasetKind.equals("view") ? datasetKind : "dataset";
                    name = d.column() != null ? names.dataset(d.id()).name() + "." + d.column() : names.dataset(d.id()).name();
                    if (d.column() == null) {
                        indirect = allIndirect.getOrDefault(d.id(), indirect);
                    }
                    List<OwnerReader.Assigned> own = assigned.getOrDefault(d.id(), List.of());
                    who = !own.isEmpty()
                            ? own.stream().map(a -> new OwnerView(a.owner(), a.kind(), a.reason(), a.origin(),
                                    a.inherited(), false)).toList()
                            : suggested.computeIfAbsent(d.id(), id -> owners.suggestedFor(id, graph.asOf()));
                }
                List<Step> path = d.path().stream()
                        .map(step -> step instanceof Hop h ? names.step(h) : names.step((ColumnHop) step)).toList();
                affected.add(new Affected(name, kind, d.id(), d.distance(), indirect, d.uncertain(), d.why(), who, path));
            }
            affected.sort(Comparator.comparingInt(Affected::distance)
                    .thenComparingInt(a -> KIND_ORDER.indexOf(a.kind()))
                    .thenComparing(Affected::name));
            return new ImpactReport(target, change.word(), change.title(target.label()), count(affected), cycle,
                    List.copyOf(affected));
        }
    }

    private static Counts count(List<Affected> affected) {
        Map<String, Integer> byKind = new HashMap<>();
        Set<String> people = new LinkedHashSet<>();
        int indirect = 0;
        int uncertain = 0;
        for (Affected a : affected) {
            byKind.merge(a.kind(), 1, Integer::sum);
            indirect += a.indirect() ? 1 : 0;
            uncertain += a.uncertain() ? 1 : 0;
            a.owners().forEach(o -> people.add(o.name()));
        }
        return new Counts(affected.size(), byKind.getOrDefault("dataset", 0), byKind.getOrDefault("column", 0),
                byKind.getOrDefault("script", 0), byKind.getOrDefault("figure", 0), byKind.getOrDefault("view", 0),
                indirect, uncertain, people.size());
    }
}
