package org.headwater.analysis.script.eval;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * The tables a SQL string passed to a read function names: the word after FROM or JOIN, or the string
 * itself when it is a bare table name (pandas.read_sql accepts both). A token scan of a string literal
 * the parser already extracted, not a SQL parser: subqueries, CTE names and quoted names with spaces
 * are beyond it, hence the lower confidence of such references.
 */
public final class SqlTables {
    private static final Set<String> TABLE_AFTER = Set.of("from", "join");

    private SqlTables() {
    }

    /** Whether the string is a bare (possibly schema-qualified) table name rather than a statement. */
    public static boolean isBareName(String sql) {
        String s = sql.strip();
        return !s.isEmpty() && s.chars().noneMatch(Character::isWhitespace) && s.matches("[\\w.\"`\\[\\]]+");
    }

    public static List<String> tablesRead(String sql) {
        if (isBareName(sql)) {
            return List.of(unquote(sql.strip()));
        }
        Set<String> ctes = new LinkedHashSet<>();
        Set<String> out = new LinkedHashSet<>();
        String[] tokens = sql.replace("(", " ( ").replace(")", " ) ").replace(",", " , ").replace(";", " ; ").trim().split("\\s+");
        for (int i = 0; i + 1 < tokens.length; i++) {
            String word = tokens[i].toLowerCase(Locale.ROOT);
            if (word.equals("with") || word.equals(",") && i + 2 < tokens.length && tokens[i + 2].equalsIgnoreCase("as")) {
                if (i + 1 < tokens.length && i + 2 < tokens.length && tokens[i + 2].equalsIgnoreCase("as")) {
                    ctes.add(unquote(tokens[i + 1]).toLowerCase(Locale.ROOT));
                }
            }
            if (TABLE_AFTER.contains(word)) {
                String next = tokens[i + 1];
                if (!next.equals("(") && !next.startsWith("$") && !next.startsWith(":")) {
                    out.add(unquote(next));
                }
            }
        }
        List<String> tables = new ArrayList<>();
        for (String t : out) {
            if (!ctes.contains(t.toLowerCase(Locale.ROOT))) {
                tables.add(t);
            }
        }
        return tables;
    }

    private static String unquote(String name) {
        return name.replace("\"", "").replace("`", "").replace("[", "").replace("]", "");
    }
}
