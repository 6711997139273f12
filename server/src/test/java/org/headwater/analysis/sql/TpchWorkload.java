package org.headwater.analysis.sql;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/**
 * The 22 TPC-H queries as published in Trino's TPC-H library (resources
 * {@code io/trino/tpch/queries/qN.sql} of {@code io.trino.tpch:tpch:1.4}, read as text only: that
 * jar's classes need Java 21), each wrapped as {@code CREATE VIEW qN AS ...} for Headwater and
 * kept as a plain query for Calcite, with the TPC-H schema DDL of this package's test resources.
 *
 * <p>Rewrites, the same text for both sides unless said otherwise:
 * <ul>
 *   <li>all: the Trino copies already substitute the TPC-H parameters with the specification's
 *       validation values; nothing else about them is changed but what follows. Their first line
 *       is a Trino metadata comment (with semicolons in it), kept above the CREATE VIEW.
 *   <li>q11: the alias {@code value} is a reserved word for Calcite's parser, so it is quoted
 *       ({@code "value"}, twice); Headwater folds it to the same name.
 *   <li>q15: Trino's copy creates view {@code revenue} and then selects from it. For Headwater
 *       it becomes {@code CREATE VIEW revenue0 AS ...; CREATE VIEW q15 AS SELECT ... revenue0 ...}
 *       (revenue0 as in the specification's stream 0), so q15 is analysed through a view
 *       created earlier in the script. Calcite's core has no CREATE VIEW, so for it the view
 *       becomes a CTE: {@code WITH revenue0 AS (...) SELECT ...}; lineage is the same.
 *   <li>q20: {@code date('1994-01-01')} becomes {@code DATE '1994-01-01'}: Calcite's standard
 *       operator table has no DATE(string) function.
 * </ul>
 */
final class TpchWorkload {

    static final String SCHEMA_RESOURCE = "/org/headwater/analysis/sql/tpch-schema.sql";

    /** One query: Headwater's script text for it and Calcite's query text. */
    record Query(int number, String headwaterScript, String calciteSql) {
        String viewName() {
            return "q" + number;
        }
    }

    private TpchWorkload() {}

    static String schemaDdl() {
        return resource(SCHEMA_RESOURCE);
    }

    static List<Query> queries() {
        List<Query> queries = new ArrayList<>();
        for (int n = 1; n <= 22; n++) {
            queries.add(query(n));
        }
        return queries;
    }

    static Query query(int n) {
        String text = resource("/io/trino/tpch/queries/q" + n + ".sql");
        int headerEnd = text.indexOf('\n');
        String header = text.substring(0, headerEnd).strip();
        String body = text.substring(headerEnd + 1).strip();
        if (body.endsWith(";")) {
            body = body.substring(0, body.length() - 1);
        }
        switch (n) {
            case 11 -> body = body.replace("AS value", "AS \"value\"").replace("  value DESC", "  \"value\" DESC");
            case 20 -> body = body.replace("date('1994-01-01')", "DATE '1994-01-01'");
            case 15 -> {
                return q15(header, body);
            }
            default -> { }
        }
        return new Query(n, header + "\nCREATE VIEW q" + n + " AS\n" + body + ";\n", body);
    }

    private static Query q15(String header, String body) {
        int split = body.indexOf(';');
        String view = body.substring(0, split).strip()
                .replace("CREATE OR REPLACE VIEW revenue AS", "")
                .strip();
        String select = body.substring(split + 1).strip().replaceAll("\\brevenue\\b", "revenue0");
        String headwater = header + "\nCREATE VIEW revenue0 AS\n" + view + ";\nCREATE VIEW q15 AS\n" + select + ";\n";
        String calcite = "WITH revenue0 AS (\n" + view + "\n)\n" + select;
        return new Query(15, headwater, calcite);
    }

    private static String resource(String path) {
        try (InputStream in = TpchWorkload.class.getResourceAsStream(path)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource " + path);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
