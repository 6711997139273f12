package org.headwater.analysis.sql;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import net.sf.jsqlparser.statement.select.Select;
import net.sf.jsqlparser.statement.select.SelectItem;
import net.sf.jsqlparser.statement.select.SetOperationList;
import net.sf.jsqlparser.statement.select.WithItem;

/**
 * The common table expressions of one WITH clause, analysed when first referenced (a CTE no
 * one reads contributes nothing), in front of those of enclosing queries.
 */
final class Ctes {

    /** Recursive CTEs are analysed to a fixpoint; origin sets only grow, so this many rounds is ample. */
    private static final int MAX_ROUNDS = 16;

    private static final Ctes NONE = new Ctes(null, List.of(), false, null);

    private final Ctes parent;
    private final Map<String, Entry> entries = new LinkedHashMap<>();
    private final boolean recursive;
    private QueryContext definingContext;

    private static final class Entry {
        final WithItem<?> item;
        QueryResult result;
        QueryResult approximation;
        boolean inProgress;

        Entry(WithItem<?> item) {
            this.item = item;
        }
    }

    private Ctes(Ctes parent, List<WithItem<?>> items, boolean recursive, QueryContext definingContext) {
        this.parent = parent;
        this.recursive = recursive;
        this.definingContext = definingContext;
        for (WithItem<?> item : items) {
            entries.put(Identifiers.normalize(item.getAliasName()), new Entry(item));
        }
    }

    static Ctes none() {
        return NONE;
    }

    /** The context with a WITH clause's CTEs in front of those already visible. */
    static QueryContext enter(List<WithItem<?>> items, QueryContext context) {
        if (items == null || items.isEmpty()) {
            return context;
        }
        // WITH RECURSIVE applies to the whole list, though the parser marks only the first item.
        boolean recursive = items.stream().anyMatch(WithItem::isRecursive);
        Ctes level = new Ctes(context.ctes(), items, recursive, null);
        QueryContext inner = context.withCtes(level);
        level.definingContext = inner;
        return inner;
    }

    /** The analysed CTE a one-part table name denotes, innermost WITH first. */
    Optional<QueryResult> lookup(QualifiedName name) {
        if (name.parts().size() != 1) {
            return Optional.empty();
        }
        for (Ctes level = this; level != null; level = level.parent) {
            Entry entry = level.entries.get(name.name());
            if (entry != null) {
                return level.resolve(entry);
            }
        }
        return Optional.empty();
    }

    private Optional<QueryResult> resolve(Entry entry) {
        if (entry.result != null) {
            return Optional.of(entry.result);
        }
        if (entry.inProgress) {
            // A reference from inside its own body: the recursive term sees the rows found so far.
            return Optional.ofNullable(entry.approximation);
        }
        entry.inProgress = true;
        try {
            entry.result = recursive ? fixpoint(entry) : analyze(entry, entry.item.getSelect());
        } finally {
            entry.inProgress = false;
        }
        return Optional.of(entry.result);
    }

    /**
     * A recursive CTE is its anchor (the first branch of its UNION) joined by what the recursive
     * branches add each round; its origins are the fixpoint of that union (SQL:2016 7.17, the
     * recursive query semantics, applied to origins rather than rows).
     */
    private QueryResult fixpoint(Entry entry) {
        Select body = entry.item.getSelect().getSelect();
        if (!(body instanceof SetOperationList union)) {
            return analyze(entry, entry.item.getSelect());
        }
        QueryResult current = analyze(entry, union.getSelect(0));
        for (int round = 0; round < MAX_ROUNDS; round++) {
            entry.approximation = current;
            QueryResult next = analyze(entry, body);
            if (next.equals(current)) {
                return next;
            }
            current = next;
        }
        definingContext.warnings().add("recursive CTE " + entry.item.getAliasName() + " did not settle; lineage may be partial");
        return current;
    }

    private QueryResult analyze(Entry entry, Select body) {
        QueryResult result = QueryAnalyzer.analyze(body, definingContext);
        List<SelectItem<?>> names = entry.item.getWithItemList();
        if (names == null) {
            return result;
        }
        List<String> columnNames = names.stream().map(item -> Identifiers.normalize(item.toString().strip())).toList();
        return result.renamed(columnNames, definingContext.warnings(), "CTE " + entry.item.getAliasName());
    }
}
