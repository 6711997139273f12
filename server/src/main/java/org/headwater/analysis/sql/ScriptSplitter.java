package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.List;

/**
 * Cuts a SQL script into statements at top-level semicolons. It knows just enough lexical
 * structure to not cut inside string literals ({@code '...'}, PostgreSQL {@code E'...'}),
 * quoted identifiers, line and (nested) block comments, and PostgreSQL dollar-quoted bodies
 * ({@code $$...$$}, {@code $tag$...$tag$}), so that a semicolon inside any of those stays put.
 * Splitting ourselves, rather than handing the whole script to the parser, lets one statement
 * fail to parse while the rest of the script is still analysed.
 */
final class ScriptSplitter {

    /** One statement's text, starting at its first token, and the 1-based line it starts on. */
    record Piece(String text, int line) {}

    private ScriptSplitter() {}

    static List<Piece> split(String script) {
        List<Piece> pieces = new ArrayList<>();
        int n = script.length();
        int line = 1;
        int start = -1; // offset of the current statement's first token
        int startLine = 0;
        int i = 0;
        while (i < n) {
            char c = script.charAt(i);
            char next = i + 1 < n ? script.charAt(i + 1) : '\0';
            if (c == '-' && next == '-') {
                while (i < n && script.charAt(i) != '\n') {
                    i++;
                }
                continue;
            }
            if (c == '/' && next == '*') {
                int end = blockCommentEnd(script, i);
                line += newlines(script, i, end);
                i = end;
                continue;
            }
            if (c == ';') {
                if (start >= 0) {
                    pieces.add(new Piece(script.substring(start, i).strip(), startLine));
                    start = -1;
                }
                i++;
                continue;
            }
            if (c == '\n') {
                line++;
                i++;
                continue;
            }
            if (Character.isWhitespace(c)) {
                i++;
                continue;
            }
            if (start < 0) {
                start = i;
                startLine = line;
            }
            int end = tokenEnd(script, i);
            line += newlines(script, i, end);
            i = end;
        }
        if (start >= 0) {
            pieces.add(new Piece(script.substring(start).strip(), startLine));
        }
        return pieces;
    }

    /** The end of the token at {@code i}: past a whole quoted run, or just one character. */
    private static int tokenEnd(String s, int i) {
        char c = s.charAt(i);
        switch (c) {
            case '\'':
                return quotedEnd(s, i, '\'', isEscapeString(s, i));
            case '"':
            case '`':
                return quotedEnd(s, i, c, false);
            case '$':
                return dollarQuotedEnd(s, i);
            default:
                return i + 1;
        }
    }

    /** PostgreSQL {@code E'...'} strings take backslash escapes; the E must start a word. */
    private static boolean isEscapeString(String s, int quote) {
        if (quote == 0 || Character.toUpperCase(s.charAt(quote - 1)) != 'E') {
            return false;
        }
        return quote == 1 || !isIdentifierPart(s.charAt(quote - 2));
    }

    private static int quotedEnd(String s, int open, char quote, boolean backslashEscapes) {
        int i = open + 1;
        while (i < s.length()) {
            char c = s.charAt(i);
            if (backslashEscapes && c == '\\') {
                i += 2;
                continue;
            }
            if (c == quote) {
                if (i + 1 < s.length() && s.charAt(i + 1) == quote) {
                    i += 2; // a doubled quote stands for itself
                    continue;
                }
                return i + 1;
            }
            i++;
        }
        return s.length(); // unterminated: the parser will report it
    }

    /**
     * {@code $tag$ ... $tag$} where tag is empty or an identifier not starting with a digit
     * (PostgreSQL manual, "Dollar-Quoted String Constants"); {@code $1} is a parameter instead.
     */
    private static int dollarQuotedEnd(String s, int open) {
        if (open > 0 && isIdentifierPart(s.charAt(open - 1))) {
            return open + 1; // part of an identifier such as a$b
        }
        int i = open + 1;
        if (i < s.length() && Character.isDigit(s.charAt(i))) {
            return open + 1;
        }
        while (i < s.length() && isIdentifierPart(s.charAt(i)) && s.charAt(i) != '$') {
            i++;
        }
        if (i >= s.length() || s.charAt(i) != '$') {
            return open + 1;
        }
        String delimiter = s.substring(open, i + 1);
        int close = s.indexOf(delimiter, i + 1);
        return close < 0 ? s.length() : close + delimiter.length();
    }

    private static int blockCommentEnd(String s, int open) {
        int depth = 0;
        int i = open;
        while (i < s.length()) {
            if (s.startsWith("/*", i)) {
                depth++; // PostgreSQL and the SQL standard nest block comments
                i += 2;
            } else if (s.startsWith("*/", i)) {
                depth--;
                i += 2;
                if (depth == 0) {
                    return i;
                }
            } else {
                i++;
            }
        }
        return s.length();
    }

    private static boolean isIdentifierPart(char c) {
        return Character.isLetterOrDigit(c) || c == '_' || c == '$';
    }

    private static int newlines(String s, int from, int to) {
        int count = 0;
        for (int i = from; i < to; i++) {
            if (s.charAt(i) == '\n') {
                count++;
            }
        }
        return count;
    }
}
