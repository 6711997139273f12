package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import net.sf.jsqlparser.schema.Column;
import net.sf.jsqlparser.schema.Table;
import net.sf.jsqlparser.statement.Statement;
import net.sf.jsqlparser.statement.create.table.ColumnDefinition;
import net.sf.jsqlparser.statement.create.table.CreateTable;
import net.sf.jsqlparser.statement.create.view.CreateView;
import net.sf.jsqlparser.statement.drop.Drop;
import net.sf.jsqlparser.statement.insert.Insert;
import net.sf.jsqlparser.statement.select.PlainSelect;
import net.sf.jsqlparser.statement.select.Select;
import net.sf.jsqlparser.statement.select.Values;

/**
 * Maps one parsed statement to its lineage, and keeps the script's catalog up to date with the
 * tables and views it defines or drops. Statements that carry no lineage yield nothing.
 */
final class StatementAnalyzer {

    private final ScriptCatalog catalog;

    StatementAnalyzer(ScriptCatalog catalog) {
        this.catalog = catalog;
    }

    Optional<StatementLineage> analyze(Statement statement, int line) {
        Warnings warnings = new Warnings();
        QueryContext context = new QueryContext(catalog, warnings, Ctes.none(), null);
        if (statement instanceof CreateView view) {
            return Optional.of(createView(view, context, line));
        }
        if (statement instanceof CreateTable table) {
            return createTable(table, context, line);
        }
        if (statement instanceof Insert insert) {
            return insert(insert, context, line);
        }
        if (statement instanceof Select select) {
            return Optional.of(select(select, context, line));
        }
        if (statement instanceof Drop drop) {
            String type = drop.getType() == null ? "" : drop.getType().toUpperCase(Locale.ROOT);
            if (type.contains("TABLE") || type.contains("VIEW")) {
                catalog.drop(name(drop.getName()));
            }
        }
        return Optional.empty();
    }

    private StatementLineage createView(CreateView view, QueryContext context, int line) {
        QualifiedName target = name(view.getView());
        List<String> names = new ArrayList<>();
        if (view.getColumnNames() != null) {
            for (Column column : view.getColumnNames()) {
                names.add(Identifiers.normalize(column.getColumnName()));
            }
        }
        QueryResult query = QueryAnalyzer.analyze(view.getSelect(), context)
                .renamed(names, context.warnings(), "view " + target);
        // A materialised view stores its rows, so later statements stop at it as at a table.
        catalog.define(view.isMaterialized()
                ? new ScriptCatalog.TableDefinition(target, columnNames(query))
                : new ScriptCatalog.ViewDefinition(target, query));
        return lineage(StatementLineage.Kind.CREATE_VIEW, target, query, context, line);
    }

    private Optional<StatementLineage> createTable(CreateTable table, QueryContext context, int line) {
        QualifiedName target = name(table.getTable());
        if (table.getSelect() != null) {
            List<String> names = table.getColumns() == null
                    ? List.of()
                    : table.getColumns().stream().map(Identifiers::normalize).toList();
            QueryResult query = QueryAnalyzer.analyze(table.getSelect(), context)
                    .renamed(names, context.warnings(), "table " + target);
            catalog.define(new ScriptCatalog.TableDefinition(target, columnNames(query)));
            return Optional.of(lineage(StatementLineage.Kind.CREATE_TABLE_AS, target, query, context, line));
        }
        List<String> names = new ArrayList<>();
        if (table.getColumnDefinitions() != null) {
            for (ColumnDefinition definition : table.getColumnDefinitions()) {
                names.add(Identifiers.normalize(definition.getColumnName()));
            }
        } else if (table.getLikeTable() != null) {
            QualifiedName like = name(table.getLikeTable());
            Optional<List<String>> likeColumns = catalog.columnsOf(like);
            if (likeColumns.isEmpty()) {
                context.warnings().add("columns of " + like + " are not known, so neither are those of " + target);
            }
            names.addAll(likeColumns.orElse(List.of()));
        }
        catalog.define(new ScriptCatalog.TableDefinition(target, names));
        List<RelColumn> columns = names.stream().map(n -> new RelColumn(n, Set.of())).toList();
        QueryResult empty = new QueryResult(columns, null, Set.of(), Set.of());
        return Optional.of(lineage(StatementLineage.Kind.CREATE_TABLE, target, empty, context, line));
    }

    /**
     * The query's columns go, by position, to the insert's column list, else to all the target's
     * known columns (SQL:2016 14.11 insert statement: no list means every column in order).
     */
    private Optional<StatementLineage> insert(Insert insert, QueryContext context, int line) {
        Select select = insert.getSelect();
        if (select == null || select instanceof Values) {
            return Optional.empty(); // INSERT ... VALUES copies no column
        }
        QualifiedName target = name(insert.getTable());
        QueryContext withCtes = Ctes.enter(insert.getWithItemsList(), context);
        QueryResult query = QueryAnalyzer.analyze(select, withCtes);
        List<String> names = new ArrayList<>();
        if (insert.getColumns() != null) {
            for (Column column : insert.getColumns()) {
                names.add(Identifiers.normalize(column.getColumnName()));
            }
        } else {
            Optional<List<String>> known = catalog.columnsOf(target);
            if (known.isPresent()) {
                names.addAll(known.get());
            } else {
                context.warnings().add("columns of " + target + " are not known; the query's column names are used");
            }
        }
        if (!names.isEmpty() && names.size() != query.columns().size()) {
            context.warnings().add("INSERT into " + target + " lists " + names.size()
                    + " columns but its query has " + query.columns().size());
            int width = Math.min(names.size(), query.columns().size());
            query = new QueryResult(query.columns().subList(0, width), query.openTable(), query.influencing(), query.sources());
            names = names.subList(0, width);
        }
        query = query.renamed(names, context.warnings(), "INSERT into " + target);
        return Optional.of(lineage(StatementLineage.Kind.INSERT_SELECT, target, query, context, line));
    }

    /** A bare SELECT, or PostgreSQL's {@code SELECT ... INTO new_table}, which creates a table. */
    private StatementLineage select(Select select, QueryContext context, int line) {
        QueryResult query = QueryAnalyzer.analyze(select, context);
        if (select instanceof PlainSelect plain && plain.getIntoTables() != null && !plain.getIntoTables().isEmpty()) {
            QualifiedName target = name(plain.getIntoTables().get(0));
            catalog.define(new ScriptCatalog.TableDefinition(target, columnNames(query)));
            return lineage(StatementLineage.Kind.CREATE_TABLE_AS, target, query, context, line);
        }
        return lineage(StatementLineage.Kind.SELECT, null, query, context, line);
    }

    private static StatementLineage lineage(
            StatementLineage.Kind kind, QualifiedName target, QueryResult query, QueryContext context, int line) {
        if (query.openTable() != null) {
            context.warnings().add("the output columns are incomplete: * over " + query.openTable() + " could not be expanded");
        }
        List<OutputColumn> columns = new ArrayList<>();
        for (int i = 0; i < query.columns().size(); i++) {
            RelColumn column = query.columns().get(i);
            columns.add(new OutputColumn(column.name(), i + 1, column.origins()));
        }
        return new StatementLineage(kind, target, columns, query.influencing(), query.sources(), context.warnings().list(), line);
    }

    private static List<String> columnNames(QueryResult query) {
        return query.columns().stream().map(RelColumn::name).toList();
    }

    static QualifiedName name(Table table) {
        return QualifiedName.fromSql(ExpressionLineage.reversed(table.getNameParts()));
    }
}
