package org.headwater.lineage;

import java.util.EnumSet;
import java.util.Objects;
import java.util.Set;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;

/**
 * What a lineage walk follows and what it reports. An empty set means "any".
 *
 * <p>Edge filters ({@code evidence}, {@code minConfidence}) decide which edges the walk may cross; the
 * dataset filters ({@code kinds}, {@code sources}) only decide which reached datasets are reported. A
 * table two hops behind an excluded file is still affected by what happens upstream of that file, so
 * the walk goes through datasets it does not report, and their hops still appear in paths.
 *
 * @param maxDepth the most hops a reported node may be away from the start; 0 reports nothing
 * @param minConfidence edges with a lower confidence are not followed (compared in single precision)
 * @param sources source ids (the {@code source} table) whose datasets are reported
 */
public record Query(int maxDepth, Set<Evidence> evidence, double minConfidence, Set<DatasetKind> kinds,
        Set<Long> sources) {

    private static final Query EVERYTHING = new Query(Integer.MAX_VALUE, Set.of(), 0.0, Set.of(), Set.of());

    public Query {
        if (maxDepth < 0) {
            throw new IllegalArgumentException("maxDepth must not be negative: " + maxDepth);
        }
        if (!(minConfidence >= 0.0 && minConfidence <= 1.0)) {
            throw new IllegalArgumentException("minConfidence must be within [0, 1]: " + minConfidence);
        }
        Objects.requireNonNull(evidence, "evidence (empty for any)");
        Objects.requireNonNull(kinds, "kinds (empty for any)");
        Objects.requireNonNull(sources, "sources (empty for any)");
        evidence = evidence.isEmpty() ? Set.of() : Set.copyOf(EnumSet.copyOf(evidence));
        kinds = kinds.isEmpty() ? Set.of() : Set.copyOf(EnumSet.copyOf(kinds));
        sources = Set.copyOf(sources);
    }

    /** Follows every edge to any depth and reports every dataset reached. */
    public static Query everything() {
        return EVERYTHING;
    }

    public Query withMaxDepth(int depth) {
        return new Query(depth, evidence, minConfidence, kinds, sources);
    }

    public Query withEvidence(Set<Evidence> allowed) {
        return new Query(maxDepth, allowed, minConfidence, kinds, sources);
    }

    public Query withMinConfidence(double minimum) {
        return new Query(maxDepth, evidence, minimum, kinds, sources);
    }

    public Query withKinds(Set<DatasetKind> reported) {
        return new Query(maxDepth, evidence, minConfidence, reported, sources);
    }

    public Query withSources(Set<Long> reported) {
        return new Query(maxDepth, evidence, minConfidence, kinds, reported);
    }
}
