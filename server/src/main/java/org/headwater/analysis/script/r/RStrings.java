package org.headwater.analysis.script.r;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Piece;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/** R string literals and sprintf. */
final class RStrings {
    private RStrings() {
    }

    /** A string literal's text. // reference: R Language Definition 10.3.1, string constants and escapes */
    static String literal(String source) {
        if (source.length() < 2) {
            return source;
        }
        String body = source.substring(1, source.length() - 1);
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < body.length(); i++) {
            char c = body.charAt(i);
            if (c != '\\' || i + 1 >= body.length()) {
                out.append(c);
                continue;
            }
            char n = body.charAt(++i);
            switch (n) {
                case 'n' -> out.append('\n');
                case 't' -> out.append('\t');
                case 'r' -> out.append('\r');
                case '0' -> out.append('\0');
                default -> out.append(n); // \\ \" \' and the rest stand for the character
            }
        }
        return out.toString();
    }

    /**
     * sprintf over known values, one format at a time; a loop item gives a hole with each value formatted.
     * // reference: R documentation of sprintf (C-style %d %s %f with flags, width, precision)
     */
    static Value sprintf(String format, List<Value> args) {
        List<Text> parts = new ArrayList<>();
        StringBuilder lit = new StringBuilder();
        int next = 0;
        for (int i = 0; i < format.length(); i++) {
            char c = format.charAt(i);
            if (c != '%') {
                lit.append(c);
                continue;
            }
            if (i + 1 < format.length() && format.charAt(i + 1) == '%') {
                lit.append('%');
                i++;
                continue;
            }
            int j = i + 1;
            while (j < format.length() && "0123456789.-+ #".indexOf(format.charAt(j)) >= 0) {
                j++;
            }
            if (j >= format.length()) {
                return new Value.Unknown("bad sprintf format");
            }
            String spec = format.substring(i, j + 1);
            Value v = next < args.size() ? args.get(next++) : new Value.Unknown("missing sprintf argument");
            parts.add(Values.lit(lit.toString()));
            lit.setLength(0);
            parts.add(one(spec, v));
            i = j;
        }
        parts.add(Values.lit(lit.toString()));
        return Values.concat(parts);
    }

    private static Text one(String spec, Value v) {
        if (v instanceof Value.Each each) {
            if (each.values() != null && each.values().size() == 1) {
                return one(spec, each.values().get(0));
            }
            return new Text(List.of(Values.hole(each, item -> format(spec, item))));
        }
        String s = format(spec, v);
        if (s != null) {
            return Values.lit(s);
        }
        if (spec.endsWith("s") && spec.length() == 2) {
            return Values.asText(v, Dialect.R);
        }
        return new Text(List.of(new Piece.Gap("sprintf " + spec + " of " + Values.describe(v))));
    }

    private static String format(String spec, Value v) {
        char type = spec.charAt(spec.length() - 1);
        try {
            if (v instanceof Value.Num n) {
                if (type == 'd' || type == 'i') {
                    return n.value() == Math.rint(n.value()) ? String.format(Locale.ROOT, spec.substring(0, spec.length() - 1) + "d", (long) n.value()) : null;
                }
                if (type == 'f' && spec.matches("%\\.?\\d*f")) {
                    // C printf rounds the exact binary value half to even, Java's Formatter half up
                    int precision = spec.length() > 2 ? Integer.parseInt(spec.substring(2, spec.length() - 1)) : 6;
                    return new java.math.BigDecimal(n.value()).setScale(precision, java.math.RoundingMode.HALF_EVEN).toPlainString();
                }
                if ("feEgGxX".indexOf(type) >= 0) {
                    return "xX".indexOf(type) >= 0 ? String.format(Locale.ROOT, spec, (long) n.value()) : String.format(Locale.ROOT, spec, n.value());
                }
                if (type == 's') {
                    return String.format(Locale.ROOT, spec, Dialect.R.number(n));
                }
            }
            if (type == 's') {
                return Values.constant(Values.asText(v, Dialect.R)).map(s -> String.format(Locale.ROOT, spec, s)).orElse(null);
            }
        } catch (java.util.IllegalFormatException e) {
            return null;
        }
        return null;
    }
}
