package org.headwater.analysis.script.value;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.function.BinaryOperator;
import java.util.function.Function;
import java.util.function.UnaryOperator;
import org.headwater.analysis.script.value.Piece.Gap;
import org.headwater.analysis.script.value.Piece.Hole;
import org.headwater.analysis.script.value.Piece.Lit;
import org.headwater.analysis.script.value.Value.Each;
import org.headwater.analysis.script.value.Value.OneOf;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Value.Unknown;

/** Operations on values that do not depend on the language. */
public final class Values {
    /** Past this many branches a choice is no longer worth carrying: it becomes unknown. */
    public static final int MAX_OPTIONS = 16;

    private Values() {
    }

    /** A choice of the given values, flattened and without repeats; a single one stands for itself. */
    public static Value oneOf(Collection<? extends Value> options) {
        Set<Value> flat = new LinkedHashSet<>();
        for (Value v : options) {
            if (v instanceof OneOf nested) {
                flat.addAll(nested.options());
            } else if (v != null) {
                flat.add(v);
            }
        }
        if (flat.isEmpty()) {
            return new Unknown("no value");
        }
        if (flat.size() == 1) {
            return flat.iterator().next();
        }
        if (flat.size() > MAX_OPTIONS) {
            return new Unknown("more than " + MAX_OPTIONS + " possible values");
        }
        return new OneOf(new ArrayList<>(flat));
    }

    /** Applies an operation to every combination of the choices among its arguments. */
    public static Value lift(List<Value> args, Function<List<Value>, Value> op) {
        int choiceAt = -1;
        for (int i = 0; i < args.size(); i++) {
            if (args.get(i) instanceof OneOf) {
                choiceAt = i;
                break;
            }
        }
        if (choiceAt < 0) {
            return op.apply(args);
        }
        List<Value> results = new ArrayList<>();
        for (Value option : ((OneOf) args.get(choiceAt)).options()) {
            List<Value> next = new ArrayList<>(args);
            next.set(choiceAt, option);
            results.add(lift(next, op));
            if (results.size() > MAX_OPTIONS) {
                return new Unknown("more than " + MAX_OPTIONS + " possible values");
            }
        }
        return oneOf(results);
    }

    public static Value lift1(Value a, UnaryOperator<Value> op) {
        return lift(List.of(a), args -> op.apply(args.get(0)));
    }

    public static Value lift2(Value a, Value b, BinaryOperator<Value> op) {
        return lift(List.of(a, b), args -> op.apply(args.get(0), args.get(1)));
    }

    /** The text form of a value in string concatenation, or a gap where it has none. */
    public static Text asText(Value v, Dialect dialect) {
        if (v instanceof Text t) {
            return t;
        }
        if (v instanceof Value.PathValue p) {
            return p.text();
        }
        if (v instanceof Value.Num n) {
            return lit(dialect.number(n));
        }
        if (v instanceof Value.Bool b) {
            return lit(dialect.bool(b.value()));
        }
        if (v instanceof Value.Nothing) {
            return lit(dialect.nothing());
        }
        if (v instanceof Each each && each.values() != null && each.values().size() == 1) {
            return asText(each.values().get(0), dialect); // a comprehension's one element, holes and all
        }
        if (v instanceof Each each) {
            return new Text(List.of(hole(each, item -> constant(asText(item, dialect)).orElse(null))));
        }
        if (v instanceof Unknown u) {
            return new Text(List.of(new Gap(u.why())));
        }
        return new Text(List.of(new Gap("not text: " + describe(v))));
    }

    /** A hole for a loop item, its values mapped to strings; one value that cannot be mapped leaves the hole open. */
    public static Hole hole(Each each, Function<Value, String> toString) {
        if (each.values() == null) {
            return new Hole(each.glob(), null);
        }
        List<String> out = new ArrayList<>();
        for (Value item : each.values()) {
            String s = toString.apply(item);
            if (s == null) {
                return new Hole(each.glob(), null);
            }
            out.add(s);
        }
        return new Hole(each.glob(), out);
    }

    public static Text lit(String s) {
        return new Text(List.of(new Lit(s)));
    }

    /** Joins texts, merging neighbouring literal pieces. */
    public static Text concat(List<Text> parts) {
        List<Piece> out = new ArrayList<>();
        for (Text t : parts) {
            for (Piece p : t.pieces()) {
                if (p instanceof Lit lit && !out.isEmpty() && out.get(out.size() - 1) instanceof Lit prev) {
                    out.set(out.size() - 1, new Lit(prev.text() + lit.text()));
                } else if (!(p instanceof Lit lit2 && lit2.text().isEmpty())) {
                    out.add(p);
                }
            }
        }
        return new Text(out);
    }

    public static Text concat(Text a, Text b) {
        return concat(List.of(a, b));
    }

    /** The exact string a value is, when it is one. */
    public static Optional<String> constant(Value v) {
        Text t = v instanceof Value.PathValue p ? p.text() : v instanceof Text tx ? tx : null;
        if (t == null) {
            return Optional.empty();
        }
        StringBuilder sb = new StringBuilder();
        for (Piece p : t.pieces()) {
            if (!(p instanceof Lit lit)) {
                return Optional.empty();
            }
            sb.append(lit.text());
        }
        return Optional.of(sb.toString());
    }

    /** Whether a value is known to be false, as an {@code if} condition: Python's falsy constants and R FALSE. */
    public static Optional<Boolean> truth(Value v) {
        if (v instanceof Value.Bool b) {
            return Optional.of(b.value());
        }
        if (v instanceof Value.Num n) {
            return Optional.of(n.value() != 0);
        }
        if (v instanceof Value.Nothing) {
            return Optional.of(false);
        }
        Optional<String> s = v instanceof Text ? constant(v) : Optional.empty();
        return s.map(x -> !x.isEmpty());
    }

    /** A short description of a value for warnings. */
    public static String describe(Value v) {
        if (v instanceof Value.Name n) {
            return n.qualified();
        }
        if (v instanceof Value.Obj o) {
            return "a " + o.type();
        }
        if (v instanceof Unknown u) {
            return u.why();
        }
        return v.getClass().getSimpleName().toLowerCase(java.util.Locale.ROOT);
    }
}
