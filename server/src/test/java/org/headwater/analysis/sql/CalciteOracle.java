package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import net.sf.jsqlparser.JSQLParserException;
import net.sf.jsqlparser.parser.CCJSqlParserUtil;
import net.sf.jsqlparser.statement.Statement;
import net.sf.jsqlparser.statement.create.table.ColDataType;
import net.sf.jsqlparser.statement.create.table.ColumnDefinition;
import net.sf.jsqlparser.statement.create.table.CreateTable;
import org.apache.calcite.avatica.util.Casing;
import org.apache.calcite.plan.RelOptTable;
import org.apache.calcite.rel.RelNode;
import org.apache.calcite.rel.RelRoot;
import org.apache.calcite.rel.core.TableScan;
import org.apache.calcite.rel.metadata.RelColumnOrigin;
import org.apache.calcite.rel.metadata.RelMetadataQuery;
import org.apache.calcite.rel.type.RelDataType;
import org.apache.calcite.rel.type.RelDataTypeFactory;
import org.apache.calcite.rex.RexNode;
import org.apache.calcite.rex.RexShuttle;
import org.apache.calcite.rex.RexSubQuery;
import org.apache.calcite.schema.SchemaPlus;
import org.apache.calcite.schema.impl.AbstractTable;
import org.apache.calcite.sql.SqlNode;
import org.apache.calcite.sql.fun.SqlLibrary;
import org.apache.calcite.sql.fun.SqlLibraryOperatorTableFactory;
import org.apache.calcite.sql.fun.SqlStdOperatorTable;
import org.apache.calcite.sql.parser.SqlParser;
import org.apache.calcite.sql.util.SqlOperatorTables;
import org.apache.calcite.sql.type.SqlTypeName;
import org.apache.calcite.tools.FrameworkConfig;
import org.apache.calcite.tools.Frameworks;
import org.apache.calcite.tools.Planner;

/**
 * Apache Calcite as the reference for column origins: each query is parsed, validated and
 * converted to relational algebra over tables built from the DDL, then
 * {@link RelMetadataQuery#getColumnOrigins} is asked about every output column.
 */
final class CalciteOracle {

    /** Calcite's answer for one query; a null entry in {@code columns} is Calcite's "don't know". */
    record Answer(List<Set<ColumnOrigin>> columns, Set<QualifiedName> tables) {}

    private final FrameworkConfig config;

    CalciteOracle(String ddl) {
        SchemaPlus root = Frameworks.createRootSchema(true);
        for (CreateTable table : tables(ddl)) {
            root.add(Identifiers.normalize(table.getTable().getName()), tableOf(table.getColumnDefinitions()));
        }
        this.config = Frameworks.newConfigBuilder()
                .defaultSchema(root)
                // The DDL's names are lower case and the queries write them unquoted.
                .parserConfig(SqlParser.config().withUnquotedCasing(Casing.UNCHANGED).withCaseSensitive(false))
                // q22's substr is no standard function; Calcite has it in its PostgreSQL library.
                .operatorTable(SqlOperatorTables.chain(
                        SqlStdOperatorTable.instance(),
                        SqlLibraryOperatorTableFactory.INSTANCE.getOperatorTable(SqlLibrary.POSTGRESQL)))
                .build();
    }

    Answer answer(String sql) {
        Planner planner = Frameworks.getPlanner(config);
        try {
            SqlNode parsed = planner.parse(sql);
            SqlNode validated = planner.validate(parsed);
            RelRoot root = planner.rel(validated);
            RelNode rel = root.project(); // drops fields kept only for ORDER BY
            RelMetadataQuery mq = rel.getCluster().getMetadataQuery();
            List<Set<ColumnOrigin>> columns = new ArrayList<>();
            for (int i = 0; i < rel.getRowType().getFieldCount(); i++) {
                Set<RelColumnOrigin> origins = mq.getColumnOrigins(rel, i);
                columns.add(origins == null ? null : convert(origins));
            }
            Set<QualifiedName> tables = new LinkedHashSet<>();
            collectScans(rel, tables);
            return new Answer(columns, tables);
        } catch (Exception e) {
            throw new IllegalStateException("Calcite could not process: " + sql, e);
        } finally {
            planner.close();
        }
    }

    private static Set<ColumnOrigin> convert(Set<RelColumnOrigin> origins) {
        List<ColumnOrigin> converted = new ArrayList<>();
        for (RelColumnOrigin origin : origins) {
            RelOptTable table = origin.getOriginTable();
            String column = table.getRowType().getFieldList().get(origin.getOriginColumnOrdinal()).getName();
            converted.add(new ColumnOrigin(new ColumnRef(new QualifiedName(table.getQualifiedName()), column), origin.isDerived()));
        }
        // Calcite may give one column both flags on different paths; Headwater keeps one, derived if any is.
        return Origins.merge(converted);
    }

    /** Every scanned table, including those inside subqueries that stay as RexSubQuery. */
    private static void collectScans(RelNode rel, Set<QualifiedName> tables) {
        if (rel instanceof TableScan scan) {
            tables.add(new QualifiedName(scan.getTable().getQualifiedName()));
        }
        rel.accept(new RexShuttle() {
            @Override
            public RexNode visitSubQuery(RexSubQuery subQuery) {
                collectScans(subQuery.rel, tables);
                return super.visitSubQuery(subQuery);
            }
        });
        for (RelNode input : rel.getInputs()) {
            collectScans(input, tables);
        }
    }

    private static List<CreateTable> tables(String ddl) {
        try {
            List<CreateTable> tables = new ArrayList<>();
            for (Statement statement : CCJSqlParserUtil.parseStatements(ddl)) {
                tables.add((CreateTable) statement);
            }
            return tables;
        } catch (JSQLParserException e) {
            throw new IllegalStateException("unreadable TPC-H DDL", e);
        }
    }

    private static AbstractTable tableOf(List<ColumnDefinition> definitions) {
        return new AbstractTable() {
            @Override
            public RelDataType getRowType(RelDataTypeFactory types) {
                RelDataTypeFactory.Builder row = types.builder();
                for (ColumnDefinition definition : definitions) {
                    row.add(Identifiers.normalize(definition.getColumnName()), typeOf(types, definition.getColDataType()));
                }
                return row.build();
            }
        };
    }

    private static RelDataType typeOf(RelDataTypeFactory types, ColDataType type) {
        String written = type.getDataType().toUpperCase(java.util.Locale.ROOT);
        String base = written.replaceAll("\\s*\\(.*", "");
        List<String> arguments = type.getArgumentsStringList();
        if ((arguments == null || arguments.isEmpty()) && written.contains("(")) {
            arguments = List.of(written.substring(written.indexOf('(') + 1, written.indexOf(')')).split("\\s*,\\s*"));
        }
        return switch (base) {
            case "INTEGER" -> types.createSqlType(SqlTypeName.INTEGER);
            case "DATE" -> types.createSqlType(SqlTypeName.DATE);
            case "DECIMAL" -> types.createSqlType(SqlTypeName.DECIMAL,
                    Integer.parseInt(arguments.get(0).strip()), Integer.parseInt(arguments.get(1).strip()));
            case "CHAR" -> types.createSqlType(SqlTypeName.CHAR, Integer.parseInt(arguments.get(0).strip()));
            case "VARCHAR" -> types.createSqlType(SqlTypeName.VARCHAR, Integer.parseInt(arguments.get(0).strip()));
            default -> throw new IllegalArgumentException("type not in the TPC-H DDL: " + written);
        };
    }
}
