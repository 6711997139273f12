package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/** The str methods that build paths: format, join, replace and case changes of known text. */
final class StrMethods {
    private StrMethods() {
    }

    static Value apply(Text t, String method, CallArgs args) {
        Optional<String> self = Values.constant(t);
        switch (method) {
            case "format" -> {
                if (self.isEmpty()) {
                    return new Value.Unknown("format of a text not known");
                }
                List<Value> positional = args.positional().stream().map(CallArgs.Arg::value).toList();
                Map<String, Value> named = new LinkedHashMap<>();
                args.named().forEach((k, v) -> named.put(k, v.value()));
                return PyFormat.format(self.get(), positional, named);
            }
            case "join" -> {
                Value items = args.at(0).map(CallArgs.Arg::value).orElse(new Value.Unknown("join"));
                if (!(items instanceof Value.Items list)) {
                    return new Value.Unknown("join of items not known");
                }
                List<Text> parts = new ArrayList<>();
                for (int i = 0; i < list.items().size(); i++) {
                    if (i > 0) {
                        parts.add(t);
                    }
                    parts.add(Values.asText(list.items().get(i), Dialect.PYTHON));
                }
                return Values.concat(parts);
            }
            default -> {
                // methods of known text only
            }
        }
        if (self.isEmpty()) {
            return new Value.Unknown("str." + method + " of a text not known");
        }
        String s = self.get();
        Optional<String> a0 = args.at(0).flatMap(a -> Values.constant(a.value()));
        Optional<String> a1 = args.at(1).flatMap(a -> Values.constant(a.value()));
        return switch (method) {
            case "lower" -> Values.lit(s.toLowerCase(Locale.ROOT));
            case "upper" -> Values.lit(s.toUpperCase(Locale.ROOT));
            case "strip" -> Values.lit(a0.map(c -> strip(s, c)).orElse(s.strip()));
            case "rstrip" -> Values.lit(a0.isPresent() ? rstrip(s, a0.get()) : s.stripTrailing());
            case "lstrip" -> Values.lit(s.stripLeading());
            case "replace" -> a0.isPresent() && a1.isPresent() ? Values.lit(s.replace(a0.get(), a1.get())) : new Value.Unknown("replace");
            default -> new Value.Unknown("str." + method);
        };
    }

    private static String strip(String s, String chars) {
        return rstrip(lstrip(s, chars), chars);
    }

    private static String lstrip(String s, String chars) {
        int i = 0;
        while (i < s.length() && chars.indexOf(s.charAt(i)) >= 0) {
            i++;
        }
        return s.substring(i);
    }

    private static String rstrip(String s, String chars) {
        int i = s.length();
        while (i > 0 && chars.indexOf(s.charAt(i - 1)) >= 0) {
            i--;
        }
        return s.substring(0, i);
    }
}
