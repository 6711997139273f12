package org.headwater.analysis.sql;

import java.util.List;
import java.util.Locale;
import net.sf.jsqlparser.expression.AnalyticExpression;
import net.sf.jsqlparser.expression.CaseExpression;
import net.sf.jsqlparser.expression.CastExpression;
import net.sf.jsqlparser.expression.Expression;
import net.sf.jsqlparser.expression.ExtractExpression;
import net.sf.jsqlparser.expression.Function;
import net.sf.jsqlparser.schema.Column;

/**
 * The name of an output column that has no alias, as PostgreSQL chooses it (its SELECT manual:
 * "for simple column references, this is the name of the referenced column; for function
 * calls, this is the name of the function"; a cast takes its operand's name and CASE is
 * called {@code case}, EXTRACT {@code extract}, from memory of its FigureColname), else
 * {@code ?column?}.
 */
final class Naming {

    static final String UNNAMED = "?column?";

    private Naming() {}

    static String defaultName(Expression expression) {
        Expression e = ExpressionLineage.unwrap(expression);
        if (e instanceof Column column) {
            return Identifiers.normalize(column.getColumnName());
        }
        if (e instanceof Function function) {
            List<String> parts = function.getMultipartName();
            return Identifiers.normalize(parts.get(parts.size() - 1));
        }
        if (e instanceof AnalyticExpression analytic) {
            return analytic.getName().toLowerCase(Locale.ROOT);
        }
        if (e instanceof CastExpression cast) {
            String inner = defaultName(cast.getLeftExpression());
            return inner.equals(UNNAMED) ? cast.getColDataType().getDataType().toLowerCase(Locale.ROOT) : inner;
        }
        if (e instanceof CaseExpression) {
            return "case";
        }
        if (e instanceof ExtractExpression) {
            return "extract"; // PostgreSQL 14 and later treat EXTRACT as a function of that name
        }
        return UNNAMED;
    }
}
