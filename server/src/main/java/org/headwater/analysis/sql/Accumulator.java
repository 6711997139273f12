package org.headwater.analysis.sql;

import java.util.Collection;
import java.util.LinkedHashSet;
import java.util.Set;

/** What a query reads and filters on, gathered while its parts are analysed. */
final class Accumulator {

    private final Set<ColumnRef> influencing = new LinkedHashSet<>();
    private final Set<QualifiedName> sources = new LinkedHashSet<>();

    void influence(Collection<ColumnOrigin> origins) {
        influencing.addAll(Origins.sources(origins));
    }

    void absorb(QueryResult inner) {
        influencing.addAll(inner.influencing());
        sources.addAll(inner.sources());
    }

    void read(QualifiedName table) {
        sources.add(table);
    }

    Set<ColumnRef> influencing() {
        return influencing;
    }

    Set<QualifiedName> sources() {
        return sources;
    }
}
