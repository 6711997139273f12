package org.headwater.search;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * The search text, read in Headwater's own syntax: plain words; {@code "a quoted phrase"}; and filters
 * written {@code field=value} or {@code field="two words"} for kind, format, owner, tag, source and fresh (a
 * freshness state: fresh, due, late, stale or unknown). Several
 * values of one filter mean any of them; different filters must all hold. Words and phrases are what is
 * searched; a text of filters only lists everything that passes them.
 *
 * @param words the plain words, in order, as typed
 * @param phrases the quoted phrases
 * @param filters filter field to its values, lower-cased
 */
record QueryText(List<String> words, List<String> phrases, Map<String, List<String>> filters) {
    static final Set<String> FILTERS = Set.of("kind", "format", "owner", "tag", "source", "fresh");
    private static final int MAX_TERMS = 32;

    /** Reads {@code text}; throws {@link QuerySyntaxException} with the position of the first problem. */
    static QueryText parse(String text) {
        List<String> words = new ArrayList<>();
        List<String> phrases = new ArrayList<>();
        Map<String, List<String>> filters = new LinkedHashMap<>();
        int i = 0;
        int n = text.length();
        while (i < n) {
            char c = text.charAt(i);
            if (Character.isWhitespace(c)) {
                i++;
            } else if (c == '"') {
                int end = closingQuote(text, i);
                String phrase = text.substring(i + 1, end).strip();
                if (!phrase.isEmpty()) {
                    phrases.add(phrase);
                }
                i = end + 1;
            } else {
                int start = i;
                while (i < n && !Character.isWhitespace(text.charAt(i)) && text.charAt(i) != '"' && text.charAt(i) != '=') {
                    i++;
                }
                String token = text.substring(start, i);
                if (i < n && text.charAt(i) == '=') {
                    String field = token.toLowerCase(Locale.ROOT);
                    if (!FILTERS.contains(field)) {
                        throw new QuerySyntaxException("Unknown filter '" + token + "' at position " + (start + 1)
                                + "; filters are " + String.join(", ", FILTERS.stream().sorted().toList())
                                + " (written field=value)");
                    }
                    i++;
                    String value;
                    if (i < n && text.charAt(i) == '"') {
                        int end = closingQuote(text, i);
                        value = text.substring(i + 1, end).strip();
                        i = end + 1;
                    } else {
                        int valueStart = i;
                        while (i < n && !Character.isWhitespace(text.charAt(i))) {
                            i++;
                        }
                        value = text.substring(valueStart, i);
                    }
                    if (value.isEmpty() || value.contains("=") || value.contains("\"")) {
                        throw new QuerySyntaxException("The filter '" + field + "=' at position " + (start + 1)
                                + " needs a value, such as " + field + "=csv or " + field + "=\"two words\"");
                    }
                    value = value.toLowerCase(Locale.ROOT);
                    if (field.equals("fresh") && !FreshnessProvider.STATES.contains(value)) {
                        throw new QuerySyntaxException("The filter 'fresh=' at position " + (start + 1) + " takes a freshness"
                                + " state: " + String.join(", ", FreshnessProvider.STATES) + " (not '" + value + "')");
                    }
                    filters.computeIfAbsent(field, k -> new ArrayList<>()).add(value);
                } else if (!token.isEmpty()) {
                    words.add(token);
                }
            }
        }
        if (words.size() + phrases.size() > MAX_TERMS) {
            throw new QuerySyntaxException("The query has more than " + MAX_TERMS + " words and phrases");
        }
        return new QueryText(List.copyOf(words), List.copyOf(phrases), filters);
    }

    private static int closingQuote(String text, int open) {
        int end = text.indexOf('"', open + 1);
        if (end < 0) {
            throw new QuerySyntaxException("The quote opened at position " + (open + 1) + " is never closed");
        }
        return end;
    }

    boolean hasText() {
        return !words.isEmpty() || !phrases.isEmpty();
    }

    /** The words and phrases as one string, without filters: what an exact name match is compared with. */
    String plainText() {
        List<String> all = new ArrayList<>(words);
        all.addAll(phrases);
        return String.join(" ", all);
    }
}
