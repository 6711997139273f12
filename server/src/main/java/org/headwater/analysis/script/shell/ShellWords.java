package org.headwater.analysis.script.shell;

import java.nio.file.Path;
import java.util.Map;
import org.headwater.analysis.script.syntax.Node;

/**
 * The text a shell word stands for after quoting and expansion, as far as the script shows it:
 * variables it set, {@code $0}, and {@code $(dirname "$0")}; anything else is {@code null}.
 * // reference: POSIX Shell Command Language, 2.2 Quoting and 2.6 Word Expansions
 */
final class ShellWords {
    private ShellWords() {
    }

    /**
     * The fields an argument becomes: an unquoted expansion is split at blanks, so {@code $DIR/x} with
     * {@code DIR="a b"} gives two fields, and an empty one gives none. // reference: POSIX Shell Command
     * Language, 2.6.5 Field Splitting (default IFS); pathname expansion of unquoted stars is not done.
     * A field the analysis cannot know is {@code null}.
     */
    static java.util.List<String> fields(Node n, Map<String, String> variables, Path driver) {
        java.util.List<String> out = new java.util.ArrayList<>();
        if (n.is("simple_expansion") || n.is("expansion")) {
            String v = value(n, variables, driver);
            if (v == null) {
                out.add(null);
            } else {
                out.addAll(split(v));
            }
            return out;
        }
        if (!n.is("concatenation")) {
            out.add(value(n, variables, driver));
            return out;
        }
        StringBuilder current = null;
        for (Node part : n.named()) {
            boolean unquoted = part.is("simple_expansion") || part.is("expansion");
            String v = value(part, variables, driver);
            if (v == null) {
                return java.util.Collections.singletonList(null);
            }
            java.util.List<String> pieces = unquoted ? split(v) : java.util.List.of(v);
            boolean leadingBlank = unquoted && !v.isEmpty() && Character.isWhitespace(v.charAt(0));
            boolean trailingBlank = unquoted && !v.isEmpty() && Character.isWhitespace(v.charAt(v.length() - 1));
            for (int i = 0; i < pieces.size(); i++) {
                if (current == null || i > 0 || leadingBlank) {
                    if (current != null) {
                        out.add(current.toString());
                    }
                    current = new StringBuilder();
                }
                current.append(pieces.get(i));
            }
            if (trailingBlank && current != null) {
                out.add(current.toString());
                current = null;
            }
        }
        if (current != null) {
            out.add(current.toString());
        }
        return out;
    }

    private static java.util.List<String> split(String v) {
        java.util.List<String> out = new java.util.ArrayList<>();
        for (String f : v.strip().split("[ \t\n]+")) {
            if (!f.isEmpty()) {
                out.add(f);
            }
        }
        return out;
    }

    static String value(Node n, Map<String, String> variables, Path driver) {
        return switch (n.type()) {
            case "word", "number", "command_name" -> n.is("command_name") ? concat(n, variables, driver) : unescape(n.text());
            case "raw_string" -> n.text().substring(1, n.text().length() - 1);
            case "string_content" -> n.text().replace("\\\"", "\"").replace("\\$", "$").replace("\\\\", "\\");
            case "string", "concatenation" -> concat(n, variables, driver);
            case "simple_expansion", "expansion" -> expansion(n, variables, driver);
            case "command_substitution" -> substitution(n, variables, driver);
            default -> null;
        };
    }

    private static String concat(Node n, Map<String, String> variables, Path driver) {
        StringBuilder sb = new StringBuilder();
        if (n.named().isEmpty()) {
            String t = n.text();
            return n.is("string") ? t.substring(1, t.length() - 1) : unescape(t);
        }
        for (Node part : n.named()) {
            String v = value(part, variables, driver);
            if (v == null) {
                return null;
            }
            sb.append(v);
        }
        return sb.toString();
    }

    private static String expansion(Node n, Map<String, String> variables, Path driver) {
        Node name = n.named().isEmpty() ? null : n.named().get(0);
        if (name == null) {
            return null;
        }
        if (n.is("expansion") && n.named().size() > 1) {
            return null; // ${X:-default} and friends depend on the environment
        }
        String var = name.text();
        if (var.equals("0")) {
            return driver.toString();
        }
        return variables.get(var);
    }

    private static String substitution(Node n, Map<String, String> variables, Path driver) {
        Node inner = n.named().isEmpty() ? null : n.named().get(0);
        if (inner != null && inner.is("command") && inner.field("name") != null && inner.field("name").text().equals("dirname")) {
            java.util.List<Node> args = inner.fields("argument");
            if (args.size() == 1) {
                String of = value(args.get(0), variables, driver);
                if (of != null) {
                    Path parent = Path.of(of).getParent();
                    return parent == null ? "." : parent.toString();
                }
            }
        }
        return null;
    }

    private static String unescape(String word) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < word.length(); i++) {
            char c = word.charAt(i);
            if (c == '\\' && i + 1 < word.length()) {
                sb.append(word.charAt(++i));
            } else {
                sb.append(c);
            }
        }
        return sb.toString();
    }
}
