package org.headwater.harvest.jdbc;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.sql.QualifiedName;

/**
 * Finds the database relation a name in a view definition denotes. Names compare case-insensitively (H2
 * prints {@code "PUBLIC"."ORDERS"}, PostgreSQL {@code public.orders}); an unqualified name is looked up in
 * the view's own schema first, then taken when exactly one schema has it.
 */
final class RelationNames {
    private final Map<String, Relation> byQualified = new HashMap<>();
    private final Map<String, List<Relation>> byName = new HashMap<>();

    RelationNames(List<Relation> relations) {
        for (Relation r : relations) {
            byQualified.put(key(r.schema(), r.name()), r);
            byName.computeIfAbsent(r.name().toLowerCase(Locale.ROOT), k -> new ArrayList<>()).add(r);
        }
    }

    Optional<Relation> find(QualifiedName name, String defaultSchema) {
        List<String> parts = name.parts();
        if (parts.size() >= 2) {
            return Optional.ofNullable(byQualified.get(key(parts.get(parts.size() - 2), parts.get(parts.size() - 1))));
        }
        Relation local = byQualified.get(key(defaultSchema, name.name()));
        if (local != null) {
            return Optional.of(local);
        }
        List<Relation> anywhere = byName.getOrDefault(name.name().toLowerCase(Locale.ROOT), List.of());
        return anywhere.size() == 1 ? Optional.of(anywhere.get(0)) : Optional.empty();
    }

    private static String key(String schema, String table) {
        return schema.toLowerCase(Locale.ROOT) + "\u0000" + table.toLowerCase(Locale.ROOT);
    }
}
