package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;

/**
 * An argparse parser as the code declares it, and the namespace it gives for a driver's command line
 * or, without one, from the defaults. // reference: Python 3 argparse docs (dest from the first long
 * option with - turned into _, nargs, type, store_true); abbreviations and sub-parsers are not followed.
 */
final class Argparse {
    /** One declared argument. */
    record Option(List<String> flags, String dest, Value defaultValue, String nargs, String type, String action) {
        boolean positional() {
            return !flags.get(0).startsWith("-");
        }

        boolean takesValue() {
            return action == null || action.equals("store") || action.equals("append");
        }

        boolean many() {
            return nargs != null && (nargs.equals("+") || nargs.equals("*") || nargs.chars().allMatch(Character::isDigit));
        }
    }

    private final List<Option> options = new ArrayList<>();

    void add(List<String> flags, Map<String, Value> named) {
        if (flags.isEmpty()) {
            return;
        }
        String dest = Values.constant(named.getOrDefault("dest", new Value.Nothing())).orElse(null);
        if (dest == null) {
            String chosen = flags.stream().filter(f -> f.startsWith("--")).findFirst().orElse(flags.get(0));
            dest = chosen.replaceFirst("^-+", "").replace('-', '_');
        }
        String nargs = named.containsKey("nargs") ? Values.constant(named.get("nargs")).orElseGet(() ->
                named.get("nargs") instanceof Value.Num n ? Long.toString((long) n.value()) : null) : null;
        String type = named.get("type") instanceof Value.Name n ? n.qualified() : null;
        String action = Values.constant(named.getOrDefault("action", new Value.Nothing())).orElse(null);
        Value def = named.get("default");
        if (def == null) {
            def = "store_true".equals(action) ? new Value.Bool(false) : "store_false".equals(action) ? new Value.Bool(true) : null;
        }
        options.add(new Option(List.copyOf(flags), dest, def, nargs, type, action));
    }

    /** The namespace: values from the command line when a driver gives one, else the defaults. */
    Map<String, Value> parse(List<String> argv) {
        Map<String, Value> out = new LinkedHashMap<>();
        for (Option o : options) {
            out.put(o.dest(), o.defaultValue() != null ? o.defaultValue()
                    : new Value.Unknown(argv == null
                            ? ReferenceMaker.NO_ARGUMENT + " for " + o.flags().get(0) + " and no default"
                            : o.flags().get(0) + " not on the driver's command line and no default"));
        }
        if (argv == null) {
            return out;
        }
        List<Option> positionals = options.stream().filter(Option::positional).toList();
        int nextPositional = 0;
        for (int i = 0; i < argv.size(); i++) {
            String token = argv.get(i);
            Option option = token == null ? null : optionFor(token);
            if (option == null) {
                if (nextPositional < positionals.size()) {
                    Option p = positionals.get(nextPositional++);
                    if (p.many()) {
                        List<Value> items = new ArrayList<>();
                        while (i < argv.size() && !isFlag(argv.get(i))) {
                            items.add(typed(argv.get(i++), p.type()));
                        }
                        i--;
                        out.put(p.dest(), new Value.Items(items));
                    } else {
                        out.put(p.dest(), typed(token, p.type()));
                    }
                }
                continue;
            }
            String inline = token.contains("=") ? token.substring(token.indexOf('=') + 1) : null;
            if (!option.takesValue()) {
                out.put(option.dest(), new Value.Bool(!"store_false".equals(option.action())));
            } else if (inline != null) {
                out.put(option.dest(), option.many() ? new Value.Items(List.of(typed(inline, option.type()))) : typed(inline, option.type()));
            } else if (option.many()) {
                List<Value> items = new ArrayList<>();
                while (i + 1 < argv.size() && !isFlag(argv.get(i + 1))) {
                    items.add(typed(argv.get(++i), option.type()));
                }
                out.put(option.dest(), new Value.Items(items));
            } else if (i + 1 < argv.size()) {
                out.put(option.dest(), typed(argv.get(++i), option.type()));
            }
        }
        return out;
    }

    private Option optionFor(String token) {
        String flag = token.contains("=") ? token.substring(0, token.indexOf('=')) : token;
        if (!flag.startsWith("-")) {
            return null;
        }
        return options.stream().filter(o -> o.flags().contains(flag)).findFirst().orElse(null);
    }

    private static boolean isFlag(String token) {
        return token != null && token.startsWith("-") && token.length() > 1 && !Character.isDigit(token.charAt(1));
    }

    private static Value typed(String token, String type) {
        if (token == null) {
            return new Value.Unknown("argument computed by the driver at run time");
        }
        try {
            if ("builtins.int".equals(type)) {
                return new Value.Num(Long.parseLong(token), true);
            }
            if ("builtins.float".equals(type)) {
                return new Value.Num(Double.parseDouble(token), false);
            }
        } catch (NumberFormatException e) {
            return new Value.Unknown("'" + token + "' is not a number");
        }
        return Values.lit(token);
    }
}
