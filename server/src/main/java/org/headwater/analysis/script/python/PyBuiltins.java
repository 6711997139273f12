package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Rendered;
import org.headwater.analysis.script.value.PathText;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/**
 * The functions whose results matter for paths, as a table from qualified name to what they give:
 * os.path, pathlib, glob, the builtins that build or pass on lists, and environment look-ups.
 * // reference: Python 3 standard library docs for each function named here
 */
final class PyBuiltins {
    /** One builtin: what it returns for evaluated arguments. */
    interface Builtin {
        Value apply(CallArgs args, PythonEvaluator ev);
    }

    static final Map<String, Builtin> TABLE = new LinkedHashMap<>();

    static {
        TABLE.put("os.path.join", (a, ev) -> lift(values(a), vs -> PathText.join(texts(vs))));
        TABLE.put("posixpath.join", TABLE.get("os.path.join"));
        TABLE.put("os.path.dirname", (a, ev) -> lift(values(a), vs -> PathText.parent(text(vs.get(0))).<Value>map(t -> t).orElse(unknown("dirname"))));
        TABLE.put("os.path.basename", (a, ev) -> lift(values(a), vs -> PathText.name(text(vs.get(0))).<Value>map(t -> t).orElse(unknown("basename"))));
        TABLE.put("os.path.abspath", (a, ev) -> lift(values(a), vs -> absolute(text(vs.get(0)), ev)));
        TABLE.put("os.path.realpath", TABLE.get("os.path.abspath"));
        TABLE.put("os.path.normpath", (a, ev) -> first(a));
        TABLE.put("os.path.expanduser", (a, ev) -> first(a));
        TABLE.put("os.path.expandvars", (a, ev) -> first(a));
        TABLE.put("os.fspath", (a, ev) -> lift(values(a), vs -> text(vs.get(0))));
        TABLE.put("os.getcwd", (a, ev) -> Values.lit(ev.run().workingDir().toString()));
        TABLE.put("os.listdir", (a, ev) -> Value.unknownItemOfListing());
        TABLE.put("os.scandir", (a, ev) -> Value.unknownItemOfListing());
        TABLE.put("os.getenv", (a, ev) -> environment(a));
        TABLE.put("os.environ.get", (a, ev) -> environment(a));
        TABLE.put("os.makedirs", (a, ev) -> new Value.Nothing());
        TABLE.put("os.mkdir", (a, ev) -> new Value.Nothing());
        TABLE.put("glob.glob", (a, ev) -> glob(a, false));
        TABLE.put("glob.iglob", (a, ev) -> glob(a, false));
        TABLE.put("pathlib.Path", (a, ev) -> lift(values(a), vs -> new Value.PathValue(vs.isEmpty() ? Values.lit(".") : PathText.join(texts(vs)))));
        TABLE.put("pathlib.PurePath", TABLE.get("pathlib.Path"));
        TABLE.put("pathlib.PosixPath", TABLE.get("pathlib.Path"));
        TABLE.put("pathlib.Path.cwd", (a, ev) -> new Value.PathValue(Values.lit(ev.run().workingDir().toString())));
        TABLE.put("pathlib.Path.home", (a, ev) -> new Value.PathValue(Values.lit("~")));
        TABLE.put("builtins.str", (a, ev) -> lift(values(a), vs -> vs.isEmpty() ? Values.lit("") : Values.asText(vs.get(0), Dialect.PYTHON)));
        TABLE.put("builtins.int", (a, ev) -> lift(values(a), vs -> number(vs, true)));
        TABLE.put("builtins.float", (a, ev) -> lift(values(a), vs -> number(vs, false)));
        TABLE.put("builtins.range", (a, ev) -> range(values(a)));
        TABLE.put("builtins.len", (a, ev) -> a.at(0).map(x -> x.value() instanceof Value.Items it
                ? (Value) new Value.Num(it.items().size(), true) : unknown("len")).orElse(unknown("len")));
        TABLE.put("builtins.list", (a, ev) -> first(a));
        TABLE.put("builtins.tuple", (a, ev) -> first(a));
        TABLE.put("builtins.sorted", (a, ev) -> first(a));
        TABLE.put("builtins.reversed", (a, ev) -> first(a));
        TABLE.put("builtins.set", (a, ev) -> first(a));
        TABLE.put("builtins.enumerate", (a, ev) -> enumerate(a));
        TABLE.put("builtins.zip", (a, ev) -> zip(values(a)));
        TABLE.put("builtins.print", (a, ev) -> new Value.Nothing());
        TABLE.put("builtins.vars", (a, ev) -> a.at(0).map(x -> x.value() instanceof Value.Obj o && o.state() instanceof PyObjects.Namespace ns
                ? (Value) new Value.Dict(ns.values()) : unknown("vars")).orElse(unknown("vars")));
        TABLE.put("builtins.dict", (a, ev) -> new Value.Dict(named(a)));
    }

    private PyBuiltins() {
    }

    static Optional<Builtin> find(String qualified) {
        return Optional.ofNullable(TABLE.get(qualified));
    }

    private static List<Value> values(CallArgs a) {
        return a.positional().stream().map(CallArgs.Arg::value).toList();
    }

    private static Map<String, Value> named(CallArgs a) {
        Map<String, Value> out = new LinkedHashMap<>();
        a.named().forEach((k, v) -> out.put(k, v.value()));
        return out;
    }

    private static Value first(CallArgs a) {
        return a.at(0).map(CallArgs.Arg::value).orElse(new Value.Items(List.of()));
    }

    private static Value lift(List<Value> args, java.util.function.Function<List<Value>, Value> op) {
        return Values.lift(args, vs -> vs.stream().anyMatch(v -> v instanceof Value.Unknown u && vs.size() == 1)
                ? vs.get(0) : op.apply(vs));
    }

    private static Text text(Value v) {
        return Values.asText(v, Dialect.PYTHON);
    }

    private static List<Text> texts(List<Value> vs) {
        return vs.stream().map(PyBuiltins::text).toList();
    }

    private static Value unknown(String what) {
        return new Value.Unknown(what + " of a value not known");
    }

    private static Value absolute(Text t, PythonEvaluator ev) {
        boolean abs = Values.constant(t).map(s -> s.startsWith("/")).orElse(
                !t.pieces().isEmpty() && t.pieces().get(0) instanceof org.headwater.analysis.script.value.Piece.Lit l && l.text().startsWith("/"));
        return abs ? t : PathText.join(List.of(Values.lit(ev.run().workingDir().toString()), t));
    }

    private static Value environment(CallArgs a) {
        String name = a.at(0).flatMap(x -> Values.constant(x.value())).orElse("?");
        Value env = new Value.Unknown("environment variable " + name);
        Optional<CallArgs.Arg> def = a.at(1).or(() -> a.named("default"));
        return def.map(d -> Values.oneOf(List.of(env, d.value()))).orElse(env);
    }

    private static Value glob(CallArgs a, boolean recursive) {
        Optional<CallArgs.Arg> pattern = a.at(0).or(() -> a.named("pathname"));
        if (pattern.isEmpty()) {
            return Value.unknownItem();
        }
        return Values.lift1(pattern.get().value(), v -> {
            Rendered r = Rendered.of(text(v));
            return r.complete() ? new Value.Each(null, r.pattern()) : Value.unknownItem();
        });
    }

    private static Value number(List<Value> vs, boolean integral) {
        if (vs.isEmpty()) {
            return new Value.Num(0, integral);
        }
        Value v = vs.get(0);
        if (v instanceof Value.Num n) {
            return new Value.Num(integral ? Math.floor(n.value()) : n.value(), integral);
        }
        Optional<String> s = Values.constant(v);
        try {
            return s.isPresent() ? new Value.Num(Double.parseDouble(s.get().strip()), integral) : unknown(integral ? "int" : "float");
        } catch (NumberFormatException e) {
            return unknown("int");
        }
    }

    private static Value range(List<Value> vs) {
        List<Double> bounds = new ArrayList<>();
        for (Value v : vs) {
            if (!(v instanceof Value.Num n)) {
                return new Value.Unknown("range of unknown bounds");
            }
            bounds.add(n.value());
        }
        double start = bounds.size() >= 2 ? bounds.get(0) : 0;
        double stop = bounds.size() >= 2 ? bounds.get(1) : bounds.isEmpty() ? 0 : bounds.get(0);
        double step = bounds.size() >= 3 ? bounds.get(2) : 1;
        List<Value> out = new ArrayList<>();
        for (double i = start; step > 0 ? i < stop : i > stop; i += step) {
            out.add(new Value.Num(i, true));
            if (out.size() > Rendered.MAX_INSTANCES) {
                return new Value.Unknown("range longer than " + Rendered.MAX_INSTANCES);
            }
        }
        return new Value.Items(out);
    }

    private static Value enumerate(CallArgs a) {
        Value items = first(a);
        if (items instanceof Value.Items it) {
            List<Value> pairs = new ArrayList<>();
            for (int i = 0; i < it.items().size(); i++) {
                pairs.add(new Value.Items(List.of(new Value.Num(i, true), it.items().get(i))));
            }
            return new Value.Items(pairs);
        }
        return new Value.Unknown("enumerate of unknown items");
    }

    private static Value zip(List<Value> lists) {
        List<List<Value>> columns = new ArrayList<>();
        for (Value v : lists) {
            if (!(v instanceof Value.Items it)) {
                return new Value.Unknown("zip of unknown items");
            }
            columns.add(it.items());
        }
        int n = columns.stream().mapToInt(List::size).min().orElse(0);
        List<Value> rows = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            List<Value> row = new ArrayList<>();
            for (List<Value> c : columns) {
                row.add(c.get(i));
            }
            rows.add(new Value.Items(row));
        }
        return new Value.Items(rows);
    }
}
