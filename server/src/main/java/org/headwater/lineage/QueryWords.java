package org.headwater.lineage;

import java.util.Arrays;
import java.util.EnumSet;
import java.util.HashSet;
import java.util.Set;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.LabelReader;

/**
 * A {@link Query} from the words people type ({@code --evidence static,runtime}, {@code kind=figure}),
 * shared by the CLI and the API so that both accept and refuse the same things with the same messages.
 */
public final class QueryWords {
    private QueryWords() {
    }

    /**
     * @param depth the most hops, or null for any
     * @param evidence comma-separated evidence words, or null for any
     * @param minConfidence a number within [0, 1], or null for 0
     * @param kinds comma-separated dataset kinds to report, or null for all
     * @param sources comma-separated source names whose datasets are reported, or null for all
     * @throws IllegalArgumentException naming the bad value and what is allowed
     */
    public static Query parse(String depth, String evidence, String minConfidence, String kinds, String sources,
            LabelReader labels) {
        Query query = Query.everything();
        if (depth != null) {
            int hops;
            try {
                hops = Integer.parseInt(depth.trim());
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("depth must be a whole number, got '" + depth + "'");
            }
            if (hops < 1) {
                throw new IllegalArgumentException("depth must be at least 1, got " + hops);
            }
            query = query.withMaxDepth(hops);
        }
        if (evidence != null) {
            query = query.withEvidence(words(evidence, "evidence", Evidence::of, Evidence.class));
        }
        if (minConfidence != null) {
            double minimum;
            try {
                minimum = Double.parseDouble(minConfidence.trim());
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException("minimum confidence must be a number, got '" + minConfidence + "'");
            }
            if (!(minimum >= 0 && minimum <= 1)) {
                throw new IllegalArgumentException("minimum confidence must be within 0 and 1, got " + minConfidence);
            }
            query = query.withMinConfidence(minimum);
        }
        if (kinds != null) {
            query = query.withKinds(words(kinds, "kind", DatasetKind::of, DatasetKind.class));
        }
        if (sources != null) {
            Set<Long> ids = new HashSet<>();
            for (String name : split(sources)) {
                ids.add(labels.sourceId(name).orElseThrow(
                        () -> new IllegalArgumentException("no source is called '" + name + "'")));
            }
            query = query.withSources(ids);
        }
        return query;
    }

    private static <E extends Enum<E>> Set<E> words(String text, String what, Function<String, E> read, Class<E> type) {
        Set<E> values = EnumSet.noneOf(type);
        for (String word : split(text)) {
            try {
                values.add(read.apply(word));
            } catch (IllegalArgumentException e) {
                String allowed = Arrays.stream(type.getEnumConstants()).map(c -> c.name().toLowerCase(java.util.Locale.ROOT))
                        .collect(Collectors.joining(", "));
                throw new IllegalArgumentException("unknown " + what + " '" + word + "'; use " + allowed);
            }
        }
        return values;
    }

    private static Set<String> split(String text) {
        Set<String> parts = new java.util.LinkedHashSet<>();
        for (String part : text.split(",")) {
            if (!part.isBlank()) {
                parts.add(part.trim());
            }
        }
        if (parts.isEmpty()) {
            throw new IllegalArgumentException("an empty list; leave the option out to mean any");
        }
        return parts;
    }
}
