package org.headwater.harvest.jdbc;

import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;

/**
 * Include and exclude globs over {@code schema.table}, compared case-insensitively because databases fold
 * unquoted names differently: {@code *} matches any run of characters (dots too), {@code ?} one character.
 */
final class TableGlobs {
    private final List<Pattern> include;
    private final List<Pattern> exclude;

    TableGlobs(List<String> include, List<String> exclude) {
        this.include = include.stream().map(TableGlobs::compile).toList();
        this.exclude = exclude.stream().map(TableGlobs::compile).toList();
    }

    boolean accepts(String schema, String table) {
        String name = (schema + "." + table).toLowerCase(Locale.ROOT);
        boolean in = include.isEmpty() || include.stream().anyMatch(p -> p.matcher(name).matches());
        return in && exclude.stream().noneMatch(p -> p.matcher(name).matches());
    }

    static Pattern compile(String glob) {
        StringBuilder regex = new StringBuilder();
        for (char c : glob.toLowerCase(Locale.ROOT).toCharArray()) {
            switch (c) {
                case '*' -> regex.append(".*");
                case '?' -> regex.append('.');
                default -> regex.append(Pattern.quote(String.valueOf(c)));
            }
        }
        return Pattern.compile(regex.toString(), Pattern.DOTALL);
    }
}
