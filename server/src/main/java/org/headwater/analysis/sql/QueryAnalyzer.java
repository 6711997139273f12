package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import net.sf.jsqlparser.expression.Expression;
import net.sf.jsqlparser.expression.LongValue;
import net.sf.jsqlparser.expression.WindowDefinition;
import net.sf.jsqlparser.expression.operators.relational.ExpressionList;
import net.sf.jsqlparser.expression.operators.relational.ParenthesedExpressionList;
import net.sf.jsqlparser.schema.Column;
import net.sf.jsqlparser.statement.select.AllColumns;
import net.sf.jsqlparser.statement.select.AllTableColumns;
import net.sf.jsqlparser.statement.select.GroupByElement;
import net.sf.jsqlparser.statement.select.OrderByElement;
import net.sf.jsqlparser.statement.select.ParenthesedSelect;
import net.sf.jsqlparser.statement.select.PlainSelect;
import net.sf.jsqlparser.statement.select.Select;
import net.sf.jsqlparser.statement.select.SelectItem;
import net.sf.jsqlparser.statement.select.SetOperationList;
import net.sf.jsqlparser.statement.select.Values;

/** Analyses a query expression (SELECT, set operation, VALUES) into its columns' origins. */
final class QueryAnalyzer {

    private QueryAnalyzer() {}

    static QueryResult analyze(Select select, QueryContext context) {
        return analyze(select, context, false);
    }

    /** For EXISTS: only what the query reads and filters on matters, not its select list. */
    static QueryResult analyzeExistence(Select select, QueryContext context) {
        return analyze(select, context, true);
    }

    private static QueryResult analyze(Select select, QueryContext outer, boolean existenceOnly) {
        QueryContext context = Ctes.enter(select.getWithItemsList(), outer);
        if (select instanceof PlainSelect plain) {
            return plain(plain, context, existenceOnly);
        }
        QueryResult result;
        if (select instanceof SetOperationList setOperation) {
            result = setOperation(setOperation, context, existenceOnly);
        } else if (select instanceof ParenthesedSelect parenthesed) {
            result = analyze(parenthesed.getSelect(), context, existenceOnly);
        } else if (select instanceof Values values) {
            result = values(values, context);
        } else {
            context.warnings().add("query form not analysed: " + select.getClass().getSimpleName());
            result = new QueryResult(List.of(), null, Set.of(), Set.of());
        }
        return cutOrder(select, result, context);
    }

    private static QueryResult plain(PlainSelect select, QueryContext context, boolean existenceOnly) {
        Accumulator accumulator = new Accumulator();
        Scope scope = FromClause.scope(select.getFromItem(), select.getJoins(), context, accumulator);
        SelectList selectList = existenceOnly
                ? new SelectList(List.of(), null)
                : selectList(select, scope, context, accumulator);
        List<RelColumn> columns = selectList.columns();
        ExpressionLineage.OutputNames outputs = outputNames(columns);

        influence(select.getWhere(), scope, context, accumulator, null);
        GroupByElement groupBy = select.getGroupBy();
        if (groupBy != null) {
            List<Expression> keys = new ArrayList<>();
            if (groupBy.getGroupByExpressionList() != null) {
                keys.addAll(expressions(groupBy.getGroupByExpressionList()));
            }
            if (groupBy.getGroupingSets() != null) {
                groupBy.getGroupingSets().forEach(set -> keys.addAll(expressions(set)));
            }
            for (Expression key : keys) {
                influenceKey(key, columns, scope, context, accumulator, outputs, ExpressionLineage.Preference.INPUT_FIRST);
            }
        }
        influence(select.getHaving(), scope, context, accumulator, outputs);
        influence(select.getQualify(), scope, context, accumulator, outputs);
        if (select.getDistinct() != null && select.getDistinct().getOnSelectItems() != null) {
            for (SelectItem<?> item : select.getDistinct().getOnSelectItems()) {
                influenceKey(item.getExpression(), columns, scope, context, accumulator, outputs,
                        ExpressionLineage.Preference.OUTPUT_FIRST);
            }
        }
        if (select.getWindowDefinitions() != null) {
            for (WindowDefinition window : select.getWindowDefinitions()) {
                if (window.getPartitionExpressionList() != null) {
                    influence(window.getPartitionExpressionList(), scope, context, accumulator, null);
                }
                orderBy(window.getOrderByElements(), columns, scope, context, accumulator, null);
            }
        }
        if (cutsRows(select)) {
            orderBy(select.getOrderByElements(), columns, scope, context, accumulator, outputs);
        }
        return new QueryResult(columns, selectList.openTable(), accumulator.influencing(), accumulator.sources());
    }

    /** The select list's columns, and the table an unexpandable {@code *} leaves open, if one. */
    private record SelectList(List<RelColumn> columns, QualifiedName openTable) {}

    private static SelectList selectList(PlainSelect select, Scope scope, QueryContext context, Accumulator accumulator) {
        List<RelColumn> columns = new ArrayList<>();
        Set<QualifiedName> open = new LinkedHashSet<>();
        boolean unknownStar = false;
        for (SelectItem<?> item : select.getSelectItems()) {
            Expression expression = item.getExpression();
            if (expression instanceof AllTableColumns tableStar) {
                QualifiedName qualifier = QualifiedName.fromSql(ExpressionLineage.reversed(tableStar.getTable().getNameParts()));
                Optional<Relation> relation = scope.relation(qualifier);
                if (relation.isEmpty()) {
                    context.warnings().add("no table or alias " + qualifier + " for " + qualifier + ".*");
                    continue;
                }
                Scope.warnIfIncomplete(relation.get(), context.warnings());
                if (!relation.get().complete()) {
                    unknownStar |= relation.get().fallback() == null;
                    if (relation.get().fallback() != null) {
                        open.add(relation.get().fallback());
                    }
                }
                columns.addAll(except(relation.get().columns(), tableStar));
            } else if (expression instanceof AllColumns star) {
                for (Relation relation : scope.relations()) {
                    if (!relation.complete()) {
                        unknownStar |= relation.fallback() == null;
                        if (relation.fallback() != null) {
                            open.add(relation.fallback());
                        }
                    }
                }
                columns.addAll(except(scope.expandAll(context.warnings()), star));
            } else {
                Set<ColumnOrigin> origins = ExpressionLineage.value(expression, scope, context, accumulator);
                String name = item.getAlias() != null
                        ? Identifiers.normalize(item.getAlias().getName())
                        : Naming.defaultName(expression);
                columns.add(new RelColumn(name, origins));
            }
        }
        QualifiedName openTable = !unknownStar && open.size() == 1 ? open.iterator().next() : null;
        return new SelectList(columns, openTable);
    }

    /** {@code * EXCEPT (a, b)}, as some dialects write it. */
    private static List<RelColumn> except(List<RelColumn> columns, AllColumns star) {
        if (star.getExceptColumns() == null || star.getExceptColumns().isEmpty()) {
            return columns;
        }
        Set<String> excluded = new LinkedHashSet<>();
        for (Column column : star.getExceptColumns()) {
            excluded.add(Identifiers.normalize(column.getColumnName()));
        }
        return columns.stream().filter(c -> !excluded.contains(c.name())).toList();
    }

    /**
     * Per position, the union of every branch's origins (Calcite's RelMdColumnOrigins treats a
     * SetOp the same way); names come from the first branch, as the SQL standard has it.
     */
    private static QueryResult setOperation(SetOperationList setOperation, QueryContext context, boolean existenceOnly) {
        Accumulator accumulator = new Accumulator();
        List<QueryResult> branches = new ArrayList<>();
        for (Select branch : setOperation.getSelects()) {
            QueryResult result = analyze(branch, context, existenceOnly);
            accumulator.absorb(result);
            branches.add(result);
        }
        QueryResult first = branches.get(0);
        int width = first.columns().size();
        List<List<ColumnOrigin>> perPosition = new ArrayList<>();
        for (int i = 0; i < width; i++) {
            perPosition.add(new ArrayList<>());
        }
        for (QueryResult branch : branches) {
            if (branch.columns().size() != width && branch.openTable() == null && first.openTable() == null) {
                context.warnings().add("set operation branches have " + width + " and " + branch.columns().size() + " columns");
            }
            for (int i = 0; i < Math.min(width, branch.columns().size()); i++) {
                perPosition.get(i).addAll(branch.columns().get(i).origins());
            }
        }
        List<RelColumn> columns = new ArrayList<>();
        for (int i = 0; i < width; i++) {
            columns.add(new RelColumn(first.columns().get(i).name(), Origins.merge(perPosition.get(i))));
        }
        return new QueryResult(columns, first.openTable(), accumulator.influencing(), accumulator.sources());
    }

    /** VALUES columns are named column1, column2, ... (PostgreSQL manual, "VALUES Lists"). */
    private static QueryResult values(Values values, QueryContext context) {
        Accumulator accumulator = new Accumulator();
        Scope scope = Scope.empty(context.outer());
        List<List<Expression>> rows = new ArrayList<>();
        if (values.getExpressions() instanceof ParenthesedExpressionList<?> onlyRow) {
            rows.add(expressions(onlyRow)); // VALUES (1, 2): the parser hands over the one row itself
        } else {
            for (Expression row : expressions(values.getExpressions())) {
                rows.add(row instanceof ExpressionList<?> list ? expressions(list) : List.of(row));
            }
        }
        int width = rows.isEmpty() ? 0 : rows.get(0).size();
        List<RelColumn> columns = new ArrayList<>();
        for (int i = 0; i < width; i++) {
            List<ColumnOrigin> origins = new ArrayList<>();
            for (List<Expression> row : rows) {
                if (i < row.size()) {
                    origins.addAll(ExpressionLineage.value(row.get(i), scope, context, accumulator));
                }
            }
            columns.add(new RelColumn("column" + (i + 1), Origins.merge(origins)));
        }
        return new QueryResult(columns, null, accumulator.influencing(), accumulator.sources());
    }

    /** ORDER BY and LIMIT around a set operation or parenthesised query see only its output columns. */
    private static QueryResult cutOrder(Select select, QueryResult result, QueryContext context) {
        if (!cutsRows(select) || select.getOrderByElements() == null) {
            return result;
        }
        Accumulator accumulator = new Accumulator();
        accumulator.absorb(result);
        Relation output = new Relation(null, null, result.columns(), result.openTable() == null, result.openTable());
        Scope scope = new Scope(List.of(output), Map.of(), context.outer());
        orderBy(select.getOrderByElements(), result.columns(), scope, context, accumulator, outputNames(result.columns()));
        return new QueryResult(result.columns(), result.openTable(), accumulator.influencing(), accumulator.sources());
    }

    /**
     * ORDER BY only reorders rows, so it influences nothing, unless LIMIT, OFFSET, FETCH or TOP
     * then cuts the ordered rows: then it decides which rows are left.
     */
    private static boolean cutsRows(Select select) {
        boolean top = select instanceof PlainSelect plain && plain.getTop() != null;
        return top || select.getLimit() != null || select.getOffset() != null || select.getFetch() != null;
    }

    private static void orderBy(
            List<OrderByElement> elements,
            List<RelColumn> columns,
            Scope scope,
            QueryContext context,
            Accumulator accumulator,
            ExpressionLineage.OutputNames outputs) {
        if (elements == null) {
            return;
        }
        for (OrderByElement element : elements) {
            influenceKey(element.getExpression(), columns, scope, context, accumulator, outputs,
                    ExpressionLineage.Preference.OUTPUT_FIRST);
        }
    }

    /** A GROUP BY, ORDER BY or DISTINCT ON key: an ordinal names an output column. */
    private static void influenceKey(
            Expression key,
            List<RelColumn> columns,
            Scope scope,
            QueryContext context,
            Accumulator accumulator,
            ExpressionLineage.OutputNames outputs,
            ExpressionLineage.Preference preference) {
        if (key instanceof LongValue ordinal) {
            long position = ordinal.getValue();
            if (position >= 1 && position <= columns.size()) {
                accumulator.influence(columns.get((int) position - 1).origins());
            } else {
                context.warnings().add("position " + position + " is not an output column");
            }
            return;
        }
        ExpressionLineage.influence(key, scope, context, accumulator, outputs, preference);
    }

    private static void influence(
            Expression expression,
            Scope scope,
            QueryContext context,
            Accumulator accumulator,
            ExpressionLineage.OutputNames outputs) {
        if (expression != null) {
            ExpressionLineage.influence(expression, scope, context, accumulator, outputs,
                    ExpressionLineage.Preference.INPUT_FIRST);
        }
    }

    private static ExpressionLineage.OutputNames outputNames(List<RelColumn> columns) {
        return name -> columns.stream().filter(c -> c.name().equals(name)).findFirst().map(RelColumn::origins);
    }

    @SuppressWarnings("unchecked")
    private static List<Expression> expressions(ExpressionList<?> list) {
        return list == null ? List.of() : new ArrayList<>((List<Expression>) (List<?>) list);
    }
}
