package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import net.sf.jsqlparser.expression.AnalyticExpression;
import net.sf.jsqlparser.expression.AnalyticType;
import net.sf.jsqlparser.expression.AnyComparisonExpression;
import net.sf.jsqlparser.expression.Expression;
import net.sf.jsqlparser.expression.ExpressionVisitorAdapter;
import net.sf.jsqlparser.expression.LambdaExpression;
import net.sf.jsqlparser.expression.operators.relational.ExistsExpression;
import net.sf.jsqlparser.expression.operators.relational.ParenthesedExpressionList;
import net.sf.jsqlparser.schema.Column;
import net.sf.jsqlparser.schema.Table;
import net.sf.jsqlparser.statement.select.AllColumns;
import net.sf.jsqlparser.statement.select.AllTableColumns;
import net.sf.jsqlparser.statement.select.OrderByElement;
import net.sf.jsqlparser.statement.select.ParenthesedSelect;
import net.sf.jsqlparser.statement.select.Select;

/**
 * Finds the source columns of one expression. Subqueries inside it are analysed with the
 * current scope as their enclosing one; what they filter on, and what they read, goes to the
 * accumulator, as do a window function's PARTITION BY and ORDER BY and an aggregate's FILTER,
 * which choose the rows a value is computed over rather than supply the value.
 */
final class ExpressionLineage extends ExpressionVisitorAdapter<Void> {

    /** The output columns of the same SELECT, which GROUP BY, HAVING and ORDER BY may name. */
    @FunctionalInterface
    interface OutputNames {
        Optional<Set<ColumnOrigin>> origins(String name);
    }

    /** Which wins when a bare name is both an input column and an output column name. */
    enum Preference {
        /** GROUP BY and HAVING: input columns win (PostgreSQL manual, SELECT, "GROUP BY Clause"). */
        INPUT_FIRST,
        /** ORDER BY and DISTINCT ON: output names win (same manual, "ORDER BY Clause"). */
        OUTPUT_FIRST
    }

    private final Scope scope;
    private final QueryContext context;
    private final Accumulator accumulator;
    private final OutputNames outputNames;
    private final Preference preference;
    private final Set<ColumnOrigin> found = new LinkedHashSet<>();

    private ExpressionLineage(
            Scope scope, QueryContext context, Accumulator accumulator, OutputNames outputNames, Preference preference) {
        this.scope = scope;
        this.context = context;
        this.accumulator = accumulator;
        this.outputNames = outputNames;
        this.preference = preference;
    }

    /** The origins of a value: as resolved for a bare column, all derived for anything else. */
    static Set<ColumnOrigin> value(Expression expression, Scope scope, QueryContext context, Accumulator accumulator) {
        ExpressionLineage lineage = new ExpressionLineage(scope, context, accumulator, null, Preference.INPUT_FIRST);
        expression.accept(lineage, null);
        Set<ColumnOrigin> origins = Origins.merge(lineage.found);
        return isBareColumn(expression) ? origins : Origins.derive(origins);
    }

    /** Records every column of a filtering, joining, grouping or ordering expression as influencing. */
    static void influence(
            Expression expression,
            Scope scope,
            QueryContext context,
            Accumulator accumulator,
            OutputNames outputNames,
            Preference preference) {
        ExpressionLineage lineage = new ExpressionLineage(scope, context, accumulator, outputNames, preference);
        expression.accept(lineage, null);
        accumulator.influence(lineage.found);
    }

    static boolean isBareColumn(Expression expression) {
        return unwrap(expression) instanceof Column;
    }

    /** {@code (x)} is {@code x}: parentheses compute nothing. */
    static Expression unwrap(Expression expression) {
        Expression e = expression;
        while (e instanceof ParenthesedExpressionList<?> list && list.size() == 1) {
            e = list.get(0);
        }
        return e;
    }

    static QualifiedName qualifier(Column column) {
        Table table = column.getTable();
        if (table == null || table.getNameParts() == null || table.getNameParts().isEmpty()) {
            return null;
        }
        List<String> parts = new ArrayList<>(table.getNameParts());
        Collections.reverse(parts); // JSqlParser keeps name parts last-first
        parts.removeIf(p -> p == null || p.isEmpty());
        return parts.isEmpty() ? null : QualifiedName.fromSql(parts);
    }

    @Override
    public <S> Void visit(Column column, S unused) {
        QualifiedName qualifier = qualifier(column);
        String name = Identifiers.normalize(column.getColumnName());
        if (qualifier == null && outputNames != null) {
            Optional<Set<ColumnOrigin>> output = outputNames.origins(name);
            boolean useOutput = preference == Preference.OUTPUT_FIRST || !scope.knows(name);
            if (output.isPresent() && useOutput) {
                found.addAll(output.get());
                return null;
            }
        }
        found.addAll(scope.resolve(qualifier, name, context.warnings()));
        return null;
    }

    @Override
    public <S> Void visit(ParenthesedSelect select, S unused) {
        subquery(select, false);
        return null;
    }

    @Override
    public <S> Void visit(Select select, S unused) {
        subquery(select, false);
        return null;
    }

    @Override
    public <S> Void visit(ExistsExpression exists, S unused) {
        if (exists.getRightExpression() instanceof Select select) {
            subquery(select, true);
        } else {
            exists.getRightExpression().accept(this, null);
        }
        return null;
    }

    @Override
    public <S> Void visit(AnyComparisonExpression any, S unused) {
        subquery(any.getSelect(), false);
        return null;
    }

    @Override
    public <S> Void visit(AnalyticExpression analytic, S unused) {
        visitAll(this, analytic.getExpression(), analytic.getOffset(), analytic.getDefaultValue(), analytic.getKeep());
        visitOrderBy(this, analytic.getFuncOrderBy());
        if (analytic.getHavingClause() != null) {
            visitAll(this, analytic.getHavingClause().getExpression());
        }
        ExpressionLineage rowChoice = new ExpressionLineage(scope, context, accumulator, outputNames, preference);
        if (analytic.getPartitionExpressionList() != null) {
            analytic.getPartitionExpressionList().accept(rowChoice, null);
        }
        // In percentile_cont(0.5) WITHIN GROUP (ORDER BY x) the ordered column is the aggregate's input
        // (SQL:2016 10.9 <aggregate function>, <ordered set function>); in OVER (ORDER BY x) it orders a window.
        boolean withinGroup = analytic.getType() == AnalyticType.WITHIN_GROUP
                || analytic.getType() == AnalyticType.WITHIN_GROUP_OVER;
        visitOrderBy(withinGroup ? this : rowChoice, analytic.getOrderByElements());
        // FILTER picks the rows an aggregate reads; Calcite's column origins likewise leave an
        // aggregate's filter out of its origins (RelMdColumnOrigins reads AggregateCall.getArgList only).
        visitAll(rowChoice, analytic.getFilterExpression());
        accumulator.influence(rowChoice.found);
        return null;
    }

    @Override
    public <S> Void visit(AllTableColumns allTableColumns, S unused) {
        QualifiedName qualifier = QualifiedName.fromSql(reversed(allTableColumns.getTable().getNameParts()));
        scope.relation(qualifier).ifPresentOrElse(
                relation -> relation.columns().forEach(c -> found.addAll(c.origins())),
                () -> context.warnings().add("no table or alias " + qualifier + " for " + qualifier + ".*"));
        return null;
    }

    @Override
    public <S> Void visit(AllColumns allColumns, S unused) {
        return null; // count(*) and the like read no particular column
    }

    @Override
    public <S> Void visit(LambdaExpression lambda, S unused) {
        return null; // its parameters are no columns, and resolving them would only warn
    }

    private void subquery(Select select, boolean existenceOnly) {
        QueryContext inner = context.withOuter(scope);
        QueryResult result = existenceOnly
                ? QueryAnalyzer.analyzeExistence(select, inner)
                : QueryAnalyzer.analyze(select, inner);
        accumulator.absorb(result);
        result.columns().forEach(c -> found.addAll(c.origins()));
    }

    private static void visitAll(ExpressionLineage visitor, Expression... expressions) {
        for (Expression e : expressions) {
            if (e != null) {
                e.accept(visitor, null);
            }
        }
    }

    private static void visitOrderBy(ExpressionLineage visitor, List<OrderByElement> elements) {
        if (elements != null) {
            elements.forEach(element -> element.getExpression().accept(visitor, null));
        }
    }

    static List<String> reversed(List<String> parts) {
        List<String> copy = new ArrayList<>(parts);
        Collections.reverse(copy);
        copy.removeIf(p -> p == null || p.isEmpty());
        return copy;
    }
}
