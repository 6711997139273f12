package org.headwater.analysis.script.lineage;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.analysis.script.ColumnFlow;

/**
 * A data frame as far as the code shows its columns. Immutable: every operation returns a new frame.
 *
 * @param sources every dataset that reaches this frame
 * @param columns columns whose origin is known, in order; an empty origin list means computed from nothing read
 * @param passThrough datasets whose other columns may still be in the frame (right after a read, every
 *     column passes through), each with whether those columns were transformed on the way (round, fillna)
 * @param opaque whether an operation the analysis does not follow touched the columns
 */
public record Frame(List<String> sources, Map<String, List<Origin>> columns, Map<String, Boolean> passThrough,
        boolean opaque) {
    public Frame {
        sources = List.copyOf(new LinkedHashSet<>(sources));
        columns = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(columns));
        passThrough = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(passThrough));
    }

    /** A frame read from a dataset: every column of it, unchanged. */
    public static Frame read(String source) {
        return new Frame(List.of(source), Map.of(), Map.of(source, false), false);
    }

    /** A frame made in code (a literal DataFrame), with no dataset behind it. */
    public static Frame empty() {
        return new Frame(List.of(), Map.of(), Map.of(), false);
    }

    /** The origins of a column, or {@code null} when the code does not show them. */
    public List<Origin> origins(String column) {
        if (columns.containsKey(column)) {
            return columns.get(column);
        }
        if (opaque || passThrough.size() != 1) {
            return null; // two datasets could each hold a column of this name: no guess
        }
        Map.Entry<String, Boolean> only = passThrough.entrySet().iterator().next();
        return List.of(new Origin(only.getKey(), column, only.getValue()));
    }

    /** Keeps only these columns, in this order. */
    public Frame select(List<String> names) {
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        boolean unknown = false;
        for (String name : names) {
            List<Origin> o = origins(name);
            if (o == null) {
                unknown = true;
            } else {
                out.put(name, o);
            }
        }
        return new Frame(sources, out, Map.of(), unknown);
    }

    /** Drops columns. */
    public Frame drop(Collection<String> names) {
        Map<String, List<Origin>> out = new LinkedHashMap<>(columns);
        names.forEach(out::remove);
        return new Frame(sources, out, passThrough, opaque);
    }

    /** Sets a column computed from others ({@code derived}) or copied from one. */
    public Frame assign(String name, Collection<String> usedColumns, boolean derived) {
        List<Origin> origins = new ArrayList<>();
        boolean unknown = false;
        for (String used : usedColumns) {
            List<Origin> o = origins(used);
            if (o == null) {
                unknown = true;
                continue;
            }
            for (Origin each : o) {
                origins.add(derived ? each.asDerived() : each);
            }
        }
        Map<String, List<Origin>> out = new LinkedHashMap<>(columns);
        out.put(name, List.copyOf(new LinkedHashSet<>(origins)));
        Frame next = new Frame(sources, out, passThrough, opaque);
        return unknown ? next.withUnknownColumn(name) : next;
    }

    private Frame withUnknownColumn(String name) {
        Map<String, List<Origin>> out = new LinkedHashMap<>(columns);
        out.remove(name);
        return new Frame(sources, out, passThrough, true);
    }

    /** Renames columns; a renamed column keeps its origin. */
    public Frame rename(Map<String, String> oldToNew) {
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        for (Map.Entry<String, List<Origin>> e : columns.entrySet()) {
            out.put(oldToNew.getOrDefault(e.getKey(), e.getKey()), e.getValue());
        }
        Frame renamed = new Frame(sources, out, passThrough, opaque);
        for (Map.Entry<String, String> e : oldToNew.entrySet()) {
            if (!columns.containsKey(e.getKey())) {
                List<Origin> o = origins(e.getKey());
                if (o != null) {
                    Map<String, List<Origin>> more = new LinkedHashMap<>(renamed.columns);
                    more.put(e.getValue(), o);
                    renamed = new Frame(sources, more, passThrough, opaque);
                }
            }
        }
        return renamed;
    }

    /** Joins another frame on key columns: keys come from both sides, other columns from their side. */
    public Frame merge(Frame right, List<String> keys) {
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        boolean unknown = opaque || right.opaque;
        for (String key : keys) {
            List<Origin> both = new ArrayList<>();
            List<Origin> l = origins(key);
            List<Origin> r = right.origins(key);
            if (l == null || r == null) {
                unknown = true;
            }
            if (l != null) {
                both.addAll(l);
            }
            if (r != null) {
                both.addAll(r);
            }
            out.put(key, List.copyOf(new LinkedHashSet<>(both)));
        }
        columns.forEach(out::putIfAbsent);
        right.columns.forEach(out::putIfAbsent);
        List<String> allSources = new ArrayList<>(sources);
        allSources.addAll(right.sources);
        Map<String, Boolean> through = new LinkedHashMap<>(passThrough);
        right.passThrough.forEach((k, v) -> through.merge(k, v, Boolean::logicalOr));
        return new Frame(allSources, out, through, unknown);
    }

    /** Stacks frames (pandas concat, dplyr bind_rows): same-named columns gather every origin. */
    public static Frame concat(List<Frame> frames) {
        Set<String> sources = new LinkedHashSet<>();
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        Map<String, Boolean> through = new LinkedHashMap<>();
        boolean opaque = false;
        for (Frame f : frames) {
            sources.addAll(f.sources);
            f.passThrough.forEach((k, v) -> through.merge(k, v, Boolean::logicalOr));
            opaque |= f.opaque;
            f.columns.forEach((k, v) -> {
                List<Origin> merged = new ArrayList<>(out.getOrDefault(k, List.of()));
                merged.addAll(v);
                out.put(k, List.copyOf(new LinkedHashSet<>(merged)));
            });
        }
        // Stacking frames read from one pattern (a loop over partitions) keeps a single pass-through source.
        return new Frame(new ArrayList<>(sources), out, through, opaque);
    }

    /** Every value transformed in place (round, fillna, astype): columns stay, values are derived. */
    public Frame transformed() {
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        columns.forEach((k, v) -> out.put(k, v.stream().map(Origin::asDerived).toList()));
        Map<String, Boolean> through = new LinkedHashMap<>();
        passThrough.keySet().forEach(k -> through.put(k, true));
        return new Frame(sources, out, through, opaque);
    }

    /** Aggregated by keys: the keys are copied, every named aggregate is derived from its input column. */
    public Frame aggregate(List<String> keys, Map<String, List<String>> aggregates) {
        Map<String, List<Origin>> out = new LinkedHashMap<>();
        boolean unknown = false;
        for (String key : keys) {
            List<Origin> o = origins(key);
            if (o == null) {
                unknown = true;
            } else {
                out.put(key, o);
            }
        }
        Frame keysOnly = new Frame(sources, out, Map.of(), opaque || unknown);
        for (Map.Entry<String, List<String>> agg : aggregates.entrySet()) {
            keysOnly = keysOnly.assignFrom(this, agg.getKey(), agg.getValue());
        }
        return keysOnly;
    }

    private Frame assignFrom(Frame input, String name, List<String> used) {
        List<Origin> origins = new ArrayList<>();
        boolean unknown = opaque;
        for (String u : used) {
            List<Origin> o = input.origins(u);
            if (o == null) {
                unknown = true;
            } else {
                o.forEach(x -> origins.add(x.asDerived()));
            }
        }
        Map<String, List<Origin>> out = new LinkedHashMap<>(columns);
        out.put(name, List.copyOf(new LinkedHashSet<>(origins)));
        return new Frame(sources, out, passThrough, unknown);
    }

    /** The columns are no longer followed (an operation the analysis does not know); the sources stay. */
    public Frame lost() {
        return new Frame(sources, Map.of(), Map.of(), true);
    }

    /** Whether every written column's origin is known. */
    public boolean complete() {
        return !opaque && passThrough.isEmpty();
    }

    /** The column flows this frame shows when written. */
    public List<ColumnFlow> flows() {
        List<ColumnFlow> out = new ArrayList<>();
        columns.forEach((name, origins) -> origins.forEach(o -> out.add(new ColumnFlow(name, o.source(), o.column(), o.derived()))));
        return out;
    }
}
