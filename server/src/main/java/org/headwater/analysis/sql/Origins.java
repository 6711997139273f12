package org.headwater.analysis.sql;

import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.Map;
import java.util.Set;

/** Set operations on origins that keep one origin per source column. */
final class Origins {

    private Origins() {}

    /**
     * Merges origins so that each source column appears once: derived if any path computes it.
     * A column copied on one path and computed on another is not "copied as is" any more.
     */
    static Set<ColumnOrigin> merge(Collection<ColumnOrigin> origins) {
        Map<ColumnRef, Boolean> derived = new LinkedHashMap<>();
        for (ColumnOrigin origin : origins) {
            derived.merge(origin.source(), origin.derived(), Boolean::logicalOr);
        }
        Set<ColumnOrigin> merged = new LinkedHashSet<>();
        derived.forEach((source, isDerived) -> merged.add(new ColumnOrigin(source, isDerived)));
        return merged;
    }

    static Set<ColumnOrigin> derive(Collection<ColumnOrigin> origins) {
        Set<ColumnOrigin> derived = new LinkedHashSet<>();
        origins.forEach(origin -> derived.add(origin.asDerived()));
        return derived;
    }

    static Set<ColumnRef> sources(Collection<ColumnOrigin> origins) {
        Set<ColumnRef> sources = new LinkedHashSet<>();
        origins.forEach(origin -> sources.add(origin.source()));
        return sources;
    }
}
