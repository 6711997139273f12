package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Piece;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/**
 * Python's string formatting of known values: format specs ({@code {m:02d}}), {@code str.format} and
 * the {@code %} operator. // reference: Python 3 docs, Format Specification Mini-Language and
 * printf-style String Formatting; only the common subset (fill, align, zero, width, precision, type).
 */
final class PyFormat {
    private PyFormat() {
    }

    /** A value written with a format spec; a loop item becomes a hole whose values are formatted. */
    static Text apply(Value value, String spec) {
        if (value instanceof Value.Each each) {
            if (each.values() != null && each.values().size() == 1) {
                return apply(each.values().get(0), spec);
            }
            return new Text(List.of(Values.hole(each, item -> Values.constant(apply(item, spec)).orElse(null))));
        }
        if (spec.isEmpty()) {
            return Values.asText(value, Dialect.PYTHON);
        }
        Optional<String> formatted = formatOne(value, spec);
        return formatted.map(Values::lit)
                .orElseGet(() -> new Text(List.of(new Piece.Gap("format spec '" + spec + "' of " + Values.describe(value)))));
    }

    private static Optional<String> formatOne(Value value, String spec) {
        Spec s = Spec.parse(spec);
        if (s == null) {
            return Optional.empty();
        }
        String body;
        if (value instanceof Value.Num n) {
            body = number(n, s);
            if (body == null) {
                return Optional.empty();
            }
        } else {
            Optional<String> text = Values.constant(Values.asText(value, Dialect.PYTHON));
            if (text.isEmpty() || !(s.type.isEmpty() || s.type.equals("s"))) {
                return Optional.empty();
            }
            body = s.precision >= 0 ? text.get().substring(0, Math.min(s.precision, text.get().length())) : text.get();
        }
        return Optional.of(pad(body, s, value instanceof Value.Num));
    }

    private static String number(Value.Num n, Spec s) {
        String t = s.type;
        double v = n.value();
        return switch (t) {
            case "d" -> n.integral() ? Long.toString((long) v) : null;
            case "", "n" -> n.integral() ? Long.toString((long) v) : Dialect.PYTHON.number(n);
            case "f", "F" -> fixed(v, s.precision < 0 ? 6 : s.precision);
            case "e" -> String.format(Locale.ROOT, "%." + (s.precision < 0 ? 6 : s.precision) + "e", v);
            case "x" -> n.integral() ? Long.toHexString((long) v) : null;
            case "X" -> n.integral() ? Long.toHexString((long) v).toUpperCase(Locale.ROOT) : null;
            case "o" -> n.integral() ? Long.toOctalString((long) v) : null;
            case "b" -> n.integral() ? Long.toBinaryString((long) v) : null;
            default -> null;
        };
    }

    /**
     * Fixed-point text of a double: Python rounds the exact binary value half to even, where Java's
     * Formatter rounds half up. // reference: Python 3 format(2.5, ".0f") == "2"
     */
    static String fixed(double v, int precision) {
        if (Double.isNaN(v) || Double.isInfinite(v)) {
            return Double.isNaN(v) ? "nan" : v > 0 ? "inf" : "-inf";
        }
        return new java.math.BigDecimal(v).setScale(precision, java.math.RoundingMode.HALF_EVEN).toPlainString();
    }

    private static String pad(String body, Spec s, boolean numeric) {
        if (body.length() >= s.width) {
            return body;
        }
        int missing = s.width - body.length();
        char fill = s.zero && s.align == 0 ? '0' : s.fill;
        char align = s.align != 0 ? s.align : s.zero ? '=' : numeric ? '>' : '<';
        String padding = String.valueOf(fill).repeat(missing);
        return switch (align) {
            case '<' -> body + padding;
            case '^' -> padding.substring(0, missing / 2) + body + padding.substring(missing / 2);
            case '=' -> body.startsWith("-") ? "-" + padding + body.substring(1) : padding + body;
            default -> padding + body;
        };
    }

    /** A parsed format spec; {@code parse} gives {@code null} for parts not followed (sign, grouping). */
    private static final class Spec {
        char fill = ' ';
        char align;
        boolean zero;
        int width;
        int precision = -1;
        String type = "";

        static Spec parse(String spec) {
            Spec s = new Spec();
            int i = 0;
            if (spec.length() >= 2 && "<>^=".indexOf(spec.charAt(1)) >= 0) {
                s.fill = spec.charAt(0);
                s.align = spec.charAt(1);
                i = 2;
            } else if (!spec.isEmpty() && "<>^=".indexOf(spec.charAt(0)) >= 0) {
                s.align = spec.charAt(0);
                i = 1;
            }
            if (i < spec.length() && spec.charAt(i) == '0') {
                s.zero = true;
                i++;
            }
            int start = i;
            while (i < spec.length() && Character.isDigit(spec.charAt(i))) {
                i++;
            }
            s.width = i > start ? Integer.parseInt(spec.substring(start, i)) : 0;
            if (i < spec.length() && spec.charAt(i) == '.') {
                int p = ++i;
                while (i < spec.length() && Character.isDigit(spec.charAt(i))) {
                    i++;
                }
                if (i == p) {
                    return null;
                }
                s.precision = Integer.parseInt(spec.substring(p, i));
            }
            s.type = spec.substring(i);
            return s.type.length() <= 1 ? s : null;
        }
    }

    /** {@code template.format(args)}: numbered, automatic and named fields with specs. */
    static Text format(String template, List<Value> args, Map<String, Value> named) {
        List<Text> parts = new ArrayList<>();
        StringBuilder lit = new StringBuilder();
        int auto = 0;
        for (int i = 0; i < template.length(); i++) {
            char c = template.charAt(i);
            if ((c == '{' || c == '}') && i + 1 < template.length() && template.charAt(i + 1) == c) {
                lit.append(c);
                i++;
                continue;
            }
            if (c != '{') {
                lit.append(c);
                continue;
            }
            int close = template.indexOf('}', i);
            if (close < 0) {
                return gap("unbalanced braces in format string");
            }
            String field = template.substring(i + 1, close);
            String name = field;
            String spec = "";
            int colon = field.indexOf(':');
            if (colon >= 0) {
                name = field.substring(0, colon);
                spec = field.substring(colon + 1);
            }
            int bang = name.indexOf('!');
            if (bang >= 0) {
                name = name.substring(0, bang);
            }
            Value v;
            if (name.isEmpty()) {
                v = auto < args.size() ? args.get(auto) : new Value.Unknown("missing format argument");
                auto++;
            } else if (name.chars().allMatch(Character::isDigit)) {
                int index = Integer.parseInt(name);
                v = index < args.size() ? args.get(index) : new Value.Unknown("missing format argument " + index);
            } else {
                v = named.getOrDefault(name, new Value.Unknown("format field " + name + " not given"));
            }
            parts.add(Values.lit(lit.toString()));
            lit.setLength(0);
            parts.add(apply(v, spec));
            i = close;
        }
        parts.add(Values.lit(lit.toString()));
        return Values.concat(parts);
    }

    /** {@code template % args}. */
    static Text percent(String template, List<Value> args) {
        List<Text> parts = new ArrayList<>();
        StringBuilder lit = new StringBuilder();
        int next = 0;
        for (int i = 0; i < template.length(); i++) {
            char c = template.charAt(i);
            if (c != '%') {
                lit.append(c);
                continue;
            }
            if (i + 1 < template.length() && template.charAt(i + 1) == '%') {
                lit.append('%');
                i++;
                continue;
            }
            int j = i + 1;
            while (j < template.length() && "0123456789.-+ #".indexOf(template.charAt(j)) >= 0) {
                j++;
            }
            if (j >= template.length()) {
                return gap("bad % format");
            }
            String flags = template.substring(i + 1, j);
            char type = template.charAt(j);
            Value v = next < args.size() ? args.get(next++) : new Value.Unknown("missing % argument");
            parts.add(Values.lit(lit.toString()));
            lit.setLength(0);
            String spec = (flags.startsWith("-") ? "<" + flags.substring(1) : flags) + (type == 's' ? "" : type == 'i' ? "d" : String.valueOf(type));
            parts.add(apply(v, spec));
            i = j;
        }
        parts.add(Values.lit(lit.toString()));
        return Values.concat(parts);
    }

    private static Text gap(String why) {
        return new Text(List.of(new Piece.Gap(why)));
    }
}
