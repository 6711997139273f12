package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import net.sf.jsqlparser.expression.Alias;
import net.sf.jsqlparser.expression.Expression;
import net.sf.jsqlparser.schema.Column;
import net.sf.jsqlparser.schema.Table;
import net.sf.jsqlparser.statement.select.FromItem;
import net.sf.jsqlparser.statement.select.Join;
import net.sf.jsqlparser.statement.select.LateralSubSelect;
import net.sf.jsqlparser.statement.select.ParenthesedFromItem;
import net.sf.jsqlparser.statement.select.ParenthesedSelect;
import net.sf.jsqlparser.statement.select.Select;
import net.sf.jsqlparser.statement.select.TableFunction;

/**
 * Turns a FROM clause and its joins into the scope the rest of the query resolves names in.
 * What joins match on (ON, USING, NATURAL) is recorded as influencing; what the FROM items read
 * (tables, and the sources and filters of subqueries, CTEs and views looked through) goes to the
 * accumulator.
 */
final class FromClause {

    private final QueryContext context;
    private final Accumulator accumulator;
    private final List<Relation> relations = new ArrayList<>();
    private final Map<String, RelColumn> joined = new LinkedHashMap<>();
    private final List<Expression> onConditions = new ArrayList<>();

    private FromClause(QueryContext context, Accumulator accumulator) {
        this.context = context;
        this.accumulator = accumulator;
    }

    static Scope scope(FromItem from, List<Join> joins, QueryContext context, Accumulator accumulator) {
        FromClause clause = new FromClause(context, accumulator);
        if (from != null) {
            clause.chain(from, joins);
        }
        Scope scope = new Scope(clause.relations, clause.joined, context.outer());
        for (Expression on : clause.onConditions) {
            ExpressionLineage.influence(on, scope, context, accumulator, null, ExpressionLineage.Preference.INPUT_FIRST);
        }
        return scope;
    }

    private void chain(FromItem first, List<Join> joins) {
        relations.addAll(relationsOf(first));
        if (joins == null) {
            return;
        }
        for (Join join : joins) {
            List<Relation> right = relationsOf(join.getRightItem());
            List<String> using = usingColumns(join, right);
            for (String name : using) {
                joinOn(name, join, right);
            }
            relations.addAll(right);
            if (join.getOnExpressions() != null) {
                onConditions.addAll(join.getOnExpressions());
            }
        }
    }

    private List<String> usingColumns(Join join, List<Relation> right) {
        List<String> names = new ArrayList<>();
        if (join.getUsingColumns() != null) {
            for (Column column : join.getUsingColumns()) {
                names.add(Identifiers.normalize(column.getColumnName()));
            }
        }
        if (join.isNatural()) {
            if (relations.stream().anyMatch(r -> !r.complete()) || right.stream().anyMatch(r -> !r.complete())) {
                context.warnings().add("NATURAL JOIN over relations whose columns are not all known: its join columns are unknown");
                return names;
            }
            Set<String> left = new LinkedHashSet<>(joined.keySet());
            relations.forEach(r -> r.columns().forEach(c -> left.add(c.name())));
            right.forEach(r -> r.columns().forEach(c -> {
                if (left.contains(c.name())) {
                    names.add(c.name());
                }
            }));
        }
        return names;
    }

    /**
     * One USING column: both sides influence the join; the merged column the query sees is the
     * left one for inner and left joins, the right one for right joins, and for a full join
     * COALESCE of both (SQL:2016 7.7 joined table, syntax rule on USING), which is a computation.
     */
    private void joinOn(String name, Join join, List<Relation> right) {
        Set<ColumnOrigin> left = new Scope(relations, joined, null).resolve(null, name, context.warnings());
        Set<ColumnOrigin> fromRight = new Scope(right, Map.of(), null).resolve(null, name, context.warnings());
        accumulator.influence(left);
        accumulator.influence(fromRight);
        Set<ColumnOrigin> merged;
        if (join.isFull()) {
            Set<ColumnOrigin> both = new LinkedHashSet<>(left);
            both.addAll(fromRight);
            merged = Origins.derive(both);
        } else {
            merged = join.isRight() ? fromRight : left;
        }
        joined.put(name, new RelColumn(name, merged));
    }

    private List<Relation> relationsOf(FromItem item) {
        if (item instanceof Table table) {
            return List.of(tableRelation(table));
        }
        if (item instanceof LateralSubSelect lateral) {
            // LATERAL sees the FROM items to its left.
            Scope left = new Scope(relations, joined, context.outer());
            return List.of(subquery(lateral, lateral.getAlias(), context.withOuter(left)));
        }
        if (item instanceof ParenthesedSelect select) {
            return List.of(subquery(select, select.getAlias(), context));
        }
        if (item instanceof ParenthesedFromItem parenthesed) {
            return parenthesed(parenthesed);
        }
        if (item instanceof TableFunction function) {
            return List.of(tableFunction(function));
        }
        if (item instanceof Select select) {
            return List.of(subquery(select, select.getAlias(), context));
        }
        context.warnings().add("FROM item not analysed: " + item);
        return List.of();
    }

    private List<Relation> parenthesed(ParenthesedFromItem parenthesed) {
        if ((parenthesed.getJoins() == null || parenthesed.getJoins().isEmpty())
                && parenthesed.getFromItem() instanceof Select select) {
            // (VALUES ...) AS v(a, b) comes out of the parser this way.
            Alias alias = parenthesed.getAlias() != null ? parenthesed.getAlias() : select.getAlias();
            return List.of(subquery(select, alias, context));
        }
        FromClause nested = new FromClause(context, accumulator);
        nested.chain(parenthesed.getFromItem(), parenthesed.getJoins());
        joined.putAll(nested.joined);
        onConditions.addAll(nested.onConditions);
        if (parenthesed.getAlias() != null) {
            context.warnings().add("alias " + parenthesed.getAlias().getName() + " of a parenthesised join is ignored");
        }
        return nested.relations;
    }

    private Relation subquery(Select select, Alias alias, QueryContext subqueryContext) {
        QueryResult result = QueryAnalyzer.analyze(select, subqueryContext);
        accumulator.absorb(result);
        String aliasName = alias == null ? null : Identifiers.normalize(alias.getName());
        return Relation.derived(aliasName, null, result.renamed(aliasColumns(alias), context.warnings(), "alias " + aliasName));
    }

    /**
     * A table function's columns all derive from its arguments. Without a column alias list it
     * yields one column named after its alias or, failing that, the function (PostgreSQL manual,
     * "Table Functions").
     */
    private Relation tableFunction(TableFunction function) {
        Scope left = new Scope(relations, joined, context.outer());
        Set<ColumnOrigin> origins = ExpressionLineage.value(function.getFunction(), left, context, accumulator);
        String aliasName = function.getAlias() == null ? null : Identifiers.normalize(function.getAlias().getName());
        List<String> names = aliasColumns(function.getAlias());
        if (names.isEmpty()) {
            names = List.of(aliasName != null ? aliasName : Naming.defaultName(function.getFunction()));
        }
        List<RelColumn> columns = names.stream().map(n -> new RelColumn(n, Origins.derive(origins))).toList();
        return new Relation(aliasName, null, columns, true, null);
    }

    private Relation tableRelation(Table table) {
        QualifiedName name = QualifiedName.fromSql(ExpressionLineage.reversed(table.getNameParts()));
        String aliasName = table.getAlias() == null ? null : Identifiers.normalize(table.getAlias().getName());
        List<String> renames = aliasColumns(table.getAlias());
        Warnings warnings = context.warnings();

        Optional<QueryResult> cte = context.ctes().lookup(name);
        if (cte.isPresent()) {
            accumulator.absorb(cte.get());
            return Relation.derived(aliasName, name, cte.get().renamed(renames, warnings, "alias of " + name));
        }
        Optional<ScriptCatalog.Definition> defined = context.catalog().find(name);
        if (defined.isPresent() && defined.get() instanceof ScriptCatalog.ViewDefinition view) {
            accumulator.absorb(view.query());
            return Relation.derived(aliasName, view.name(), view.query().renamed(renames, warnings, "alias of " + name));
        }
        QualifiedName tableName = defined.map(ScriptCatalog.Definition::name).orElse(name);
        Optional<List<String>> columns = defined.isPresent()
                ? Optional.of(defined.get().columnNames())
                : context.catalog().catalogColumns(name);
        accumulator.read(tableName);
        if (columns.isEmpty()) {
            warnings.add("columns of " + tableName + " are not known");
            if (!renames.isEmpty()) {
                warnings.add("column aliases of " + aliasName + " cannot be matched to the unknown columns of " + tableName);
            }
            return new Relation(aliasName, tableName, List.of(), false, tableName);
        }
        List<RelColumn> relationColumns = new ArrayList<>();
        for (int i = 0; i < columns.get().size(); i++) {
            RelColumn column = RelColumn.ofTable(tableName, columns.get().get(i));
            relationColumns.add(i < renames.size() ? column.renamed(renames.get(i)) : column);
        }
        return new Relation(aliasName, tableName, relationColumns, true, tableName);
    }

    private static List<String> aliasColumns(Alias alias) {
        if (alias == null || alias.getAliasColumns() == null) {
            return List.of();
        }
        return alias.getAliasColumns().stream().map(c -> Identifiers.normalize(c.name)).toList();
    }
}
