package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.function.Function;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/** Python string literals, f-strings included, as text values. */
final class PyStrings {
    private PyStrings() {
    }

    /** The value of a {@code string} or {@code concatenated_string} node; f-string fields are evaluated by {@code eval}. */
    static Text of(Node node, Function<Node, Value> eval) {
        if (node.is("concatenated_string")) {
            List<Text> parts = new ArrayList<>();
            for (Node part : node.named()) {
                parts.add(of(part, eval));
            }
            return Values.concat(parts);
        }
        String prefix = "";
        List<Text> parts = new ArrayList<>();
        for (Node child : node.children()) {
            switch (child.type()) {
                case "string_start" -> prefix = child.text().replaceAll("['\"]", "").toLowerCase(Locale.ROOT);
                case "string_content" -> parts.add(Values.lit(content(child.text(), prefix)));
                case "interpolation" -> parts.add(field(child, eval));
                default -> {
                    // string_end and quotes carry no text
                }
            }
        }
        return Values.concat(parts);
    }

    private static String content(String raw, String prefix) {
        String text = prefix.contains("r") ? raw : unescape(raw);
        // reference: Python 3 lexical analysis, f-strings: doubled braces stand for one
        return prefix.contains("f") ? text.replace("{{", "{").replace("}}", "}") : text;
    }

    private static Text field(Node interpolation, Function<Node, Value> eval) {
        Node expression = interpolation.field("expression");
        Node spec = interpolation.field("format_specifier");
        Node conversion = interpolation.field("type_conversion");
        if (expression == null) {
            return new Text(List.of(new org.headwater.analysis.script.value.Piece.Gap("empty f-string field")));
        }
        Value value = eval.apply(expression);
        if (conversion != null && conversion.text().equals("!r")) {
            return new Text(List.of(new org.headwater.analysis.script.value.Piece.Gap("repr() in f-string")));
        }
        String specText = spec == null ? "" : spec.text().substring(1);
        if (spec != null && !spec.named().isEmpty()) {
            return new Text(List.of(new org.headwater.analysis.script.value.Piece.Gap("nested format field")));
        }
        return PyFormat.apply(value, specText);
    }

    /** Backslash escapes of non-raw literals. // reference: Python 3 lexical analysis, escape sequences */
    static String unescape(String s) {
        if (s.indexOf('\\') < 0) {
            return s;
        }
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c != '\\' || i + 1 >= s.length()) {
                out.append(c);
                continue;
            }
            char n = s.charAt(++i);
            switch (n) {
                case 'n' -> out.append('\n');
                case 't' -> out.append('\t');
                case 'r' -> out.append('\r');
                case '0' -> out.append('\0');
                case '\\' -> out.append('\\');
                case '\'' -> out.append('\'');
                case '"' -> out.append('"');
                case '\n' -> {
                    // a backslash at the end of a line continues the literal
                }
                case 'x' -> {
                    out.append((char) Integer.parseInt(s.substring(i + 1, Math.min(i + 3, s.length())), 16));
                    i += 2;
                }
                case 'u' -> {
                    out.append((char) Integer.parseInt(s.substring(i + 1, Math.min(i + 5, s.length())), 16));
                    i += 4;
                }
                default -> out.append('\\').append(n); // unknown escapes stay as written, as Python keeps them
            }
        }
        return out.toString();
    }

    static Dialect dialect() {
        return Dialect.PYTHON;
    }
}
