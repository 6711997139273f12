package org.headwater.analysis.sql;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * A possibly qualified SQL object name ({@code catalog.schema.table}), its parts already
 * normalised: unquoted identifiers lower-cased, quoted ones kept exactly, quotes removed.
 */
public record QualifiedName(List<String> parts) {

    public QualifiedName {
        Objects.requireNonNull(parts, "parts");
        if (parts.isEmpty() || parts.stream().anyMatch(p -> p == null || p.isEmpty())) {
            throw new IllegalArgumentException("a qualified name needs non-empty parts: " + parts);
        }
        parts = List.copyOf(parts);
    }

    /** A name from parts that are already normalised. */
    public static QualifiedName of(String... parts) {
        return new QualifiedName(Arrays.asList(parts));
    }

    /**
     * A name from identifiers as written in SQL: each part is lower-cased unless it is quoted
     * ({@code "Name"}, {@code `Name`} or {@code [Name]}), in which case the quotes go and the case stays.
     */
    public static QualifiedName fromSql(List<String> writtenParts) {
        return new QualifiedName(writtenParts.stream().map(Identifiers::normalize).toList());
    }

    /** The unqualified object name, the last part. */
    public String name() {
        return parts.get(parts.size() - 1);
    }

    /** True when this name equals {@code other}'s trailing parts, e.g. {@code t} of {@code s.t}. */
    public boolean isSuffixOf(QualifiedName other) {
        int offset = other.parts.size() - parts.size();
        return offset >= 0 && other.parts.subList(offset, other.parts.size()).equals(parts);
    }

    @Override
    public String toString() {
        return String.join(".", parts);
    }
}
