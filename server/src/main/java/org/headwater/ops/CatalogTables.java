package org.headwater.ops;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Pattern;
import org.headwater.store.schema.DefaultSchema;
import org.jooq.ForeignKey;
import org.jooq.Table;

/** The catalog's tables in an order where every table comes after the tables it references. */
final class CatalogTables {
    /**
     * Tables that may hold credentials (even hashed) never leave the store in an export; access control
     * is set up again on the target.
     */
    private static final Pattern NEVER_EXPORTED = Pattern.compile(".*(token|secret|password|credential).*");

    private CatalogTables() {
    }

    static List<Table<?>> inDependencyOrder() {
        List<Table<?>> all = new ArrayList<>(DefaultSchema.DEFAULT_SCHEMA.getTables());
        all.removeIf(t -> NEVER_EXPORTED.matcher(name(t)).matches());
        all.sort(Comparator.comparing(CatalogTables::name));
        Set<Table<?>> ordered = new LinkedHashSet<>();
        for (Table<?> t : all) {
            visit(t, all, ordered, new LinkedHashSet<>());
        }
        return List.copyOf(ordered);
    }

    private static void visit(Table<?> table, List<Table<?>> all, Set<Table<?>> ordered, Set<Table<?>> path) {
        if (ordered.contains(table) || !path.add(table)) {
            return;
        }
        for (ForeignKey<?, ?> fk : table.getReferences()) {
            Table<?> target = fk.getKey().getTable();
            if (!target.equals(table) && all.contains(target)) {
                visit(target, all, ordered, path);
            }
        }
        ordered.add(table);
    }

    static String name(Table<?> table) {
        return table.getName().toLowerCase(Locale.ROOT);
    }
}
