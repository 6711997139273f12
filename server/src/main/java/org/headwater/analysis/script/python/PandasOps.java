package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Obj;
import org.headwater.analysis.script.value.Values;

/**
 * What pandas data-frame methods do to columns. Methods not in these tables keep the frame's sources
 * but lose its columns, so a write after them is dataset-level only.
 * // reference: pandas 2 API reference (DataFrame methods named below), from memory
 */
final class PandasOps {
    /** Methods that change rows only: every column keeps its origin. */
    static final Set<String> ROWS_ONLY = Set.of("dropna", "sort_values", "sort_index", "head", "tail", "query",
            "drop_duplicates", "reset_index", "set_index", "copy", "sample", "nlargest", "nsmallest", "explode",
            "reindex", "infer_objects", "convert_dtypes", "loc", "iloc", "filter_rows", "collect", "lazy",
            "sort", "unique", "limit");
    /** Methods that recompute every value in place: columns stay, values become derived. */
    static final Set<String> VALUES_ONLY = Set.of("round", "fillna", "astype", "abs", "clip", "replace", "interpolate",
            "ffill", "bfill", "applymap", "map", "where", "mask", "cast", "fill_null");
    /** Aggregations of a group-by without named outputs: keys copied, every other column derived. */
    static final Set<String> AGGREGATIONS = Set.of("mean", "sum", "min", "max", "median", "count", "std", "var",
            "first", "last", "nunique", "size", "prod");

    private PandasOps() {
    }

    static Value frame(String type, Frame f) {
        return new Obj(type, f);
    }

    /** A method on a frame, or empty when the method is not a frame operation (then the caller tries the tables). */
    static Optional<Value> method(Obj receiver, Frame f, String method, CallArgs args, PythonEvaluator ev) {
        String type = receiver.type();
        if (ROWS_ONLY.contains(method)) {
            return Optional.of(frame(type, f));
        }
        if (VALUES_ONLY.contains(method)) {
            return Optional.of(frame(type, f.transformed()));
        }
        return Optional.ofNullable(switch (method) {
            case "rename" -> rename(type, f, args);
            case "assign", "with_columns" -> assign(type, f, args, ev);
            case "merge", "join" -> merge(type, f, args);
            case "drop" -> drop(type, f, args);
            case "select" -> names(args.at(0).map(CallArgs.Arg::value).orElse(null))
                    .map(n -> frame(type, f.select(n))).orElse(null);
            case "groupby", "group_by" -> new Obj(PyObjects.GROUPBY, new PyObjects.GroupBy(f,
                    names(args.at(0).or(() -> args.named("by")).map(CallArgs.Arg::value).orElse(null)).orElse(List.of()), null));
            default -> null;
        });
    }

    /** A method on a group-by: aggregations give a frame of keys and derived aggregates. */
    static Value groupMethod(PyObjects.GroupBy g, String method, CallArgs args) {
        if (method.equals("agg") || method.equals("aggregate")) {
            Map<String, List<String>> named = new LinkedHashMap<>();
            boolean followed = true;
            for (Map.Entry<String, CallArgs.Arg> e : args.named().entrySet()) {
                // named aggregation: out=("column", "func")
                if (e.getValue().value() instanceof Value.Items it && !it.items().isEmpty()) {
                    Optional<String> col = Values.constant(it.items().get(0));
                    if (col.isPresent()) {
                        named.put(e.getKey(), List.of(col.get()));
                        continue;
                    }
                }
                followed = false;
            }
            Optional<Value> first = args.at(0).map(CallArgs.Arg::value);
            if (first.isPresent() && g.column() != null) {
                // series.agg(["mean", "min"]): one derived column per function
                Optional<List<String>> funcs = names(first.get());
                if (funcs.isPresent()) {
                    funcs.get().forEach(fn -> named.put(fn, List.of(g.column())));
                } else {
                    followed = false;
                }
            } else if (first.isPresent() && first.get() instanceof Value.Dict d) {
                d.entries().keySet().forEach(col -> named.put(col, List.of(col)));
            } else if (first.isPresent()) {
                followed = false;
            }
            Frame out = g.frame().aggregate(g.keys(), named);
            return new Obj("pandas.DataFrame", followed ? out : out.lost());
        }
        if (AGGREGATIONS.contains(method)) {
            Map<String, List<String>> named = new LinkedHashMap<>();
            if (g.column() != null) {
                named.put(method.equals("size") ? "size" : g.column(), List.of(g.column()));
                return new Obj("pandas.DataFrame", g.frame().aggregate(g.keys(), named));
            }
            Frame keys = g.frame().aggregate(g.keys(), named);
            // every other column is aggregated: known columns become derived, unlisted ones stay open
            Frame all = g.frame().transformed();
            Map<String, List<Origin>> columns = new LinkedHashMap<>(keys.columns());
            all.columns().forEach(columns::putIfAbsent);
            return new Obj("pandas.DataFrame", new Frame(all.sources(), columns, all.passThrough(), all.opaque()));
        }
        return new Obj("pandas.DataFrame", g.frame().lost());
    }

    private static Value rename(String type, Frame f, CallArgs args) {
        Optional<CallArgs.Arg> columns = args.named("columns").or(() -> args.at(0));
        if (columns.isPresent() && columns.get().value() instanceof Value.Dict d) {
            Map<String, String> map = new LinkedHashMap<>();
            for (Map.Entry<String, Value> e : d.entries().entrySet()) {
                Optional<String> to = Values.constant(e.getValue());
                if (to.isEmpty()) {
                    return frame(type, f.lost());
                }
                map.put(e.getKey(), to.get());
            }
            return frame(type, f.rename(map));
        }
        return frame(type, f.lost());
    }

    private static Value assign(String type, Frame f, CallArgs args, PythonEvaluator ev) {
        Frame out = f;
        for (Map.Entry<String, CallArgs.Arg> e : args.named().entrySet()) {
            Value v = e.getValue().value();
            if (v instanceof Obj o && o.state() instanceof PyObjects.Lambda l) {
                v = ev.invokeLambda(l, List.of(frame(type, out)));
            }
            out = withColumn(out, e.getKey(), v);
        }
        return frame(type, args.splat() || !args.positional().isEmpty() ? out.lost() : out);
    }

    /** A column set from a value: a series keeps its origins, a constant has none. */
    static Frame withColumn(Frame f, String name, Value v) {
        Optional<PyObjects.Series> s = PythonEvaluator.series(v);
        if (s.isPresent()) {
            Frame next = f.drop(List.of(name));
            Map<String, List<Origin>> columns = new LinkedHashMap<>(next.columns());
            columns.put(name, s.get().origins());
            return new Frame(f.sources(), columns, f.passThrough(), f.opaque() || s.get().unknown());
        }
        if (v instanceof Value.Num || v instanceof Value.Text || v instanceof Value.Bool || v instanceof Value.Each
                || v instanceof Value.Items) {
            return f.assign(name, List.of(), true);
        }
        Map<String, List<Origin>> columns = new LinkedHashMap<>(f.columns());
        columns.remove(name);
        return new Frame(f.sources(), columns, f.passThrough(), true);
    }

    private static Value merge(String type, Frame f, CallArgs args) {
        Optional<Frame> right = args.at(0).or(() -> args.named("right")).or(() -> args.named("other"))
                .flatMap(a -> PythonEvaluator.frame(a.value()));
        Optional<List<String>> on = args.named("on").flatMap(a -> names(a.value()));
        if (right.isEmpty() || on.isEmpty()) {
            Frame lost = right.map(r -> f.merge(r, List.of()).lost()).orElse(f.lost());
            return frame(type, lost);
        }
        return frame(type, f.merge(right.get(), on.get()));
    }

    private static Value drop(String type, Frame f, CallArgs args) {
        Optional<List<String>> cols = args.named("columns").or(() -> args.at(0)).flatMap(a -> names(a.value()));
        return frame(type, cols.map(f::drop).orElse(f.lost()));
    }

    /** Module functions of pandas and polars that combine frames. */
    static Optional<Value> function(String qualified, CallArgs args) {
        String simple = qualified.substring(qualified.lastIndexOf('.') + 1);
        String type = qualified.startsWith("polars.") ? "polars.DataFrame" : "pandas.DataFrame";
        switch (simple) {
            case "concat" -> {
                Value items = args.at(0).or(() -> args.named("objs")).map(CallArgs.Arg::value).orElse(new Value.Items(List.of()));
                List<Frame> frames = frames(items);
                return Optional.of(frames.isEmpty() ? new Obj(type, Frame.empty().lost()) : frame(type, Frame.concat(frames)));
            }
            case "merge" -> {
                Optional<Frame> left = args.at(0).flatMap(a -> PythonEvaluator.frame(a.value()));
                Optional<Frame> right = args.at(1).flatMap(a -> PythonEvaluator.frame(a.value()));
                Optional<List<String>> on = args.named("on").flatMap(a -> names(a.value()));
                if (left.isPresent() && right.isPresent()) {
                    return Optional.of(frame(type, on.map(k -> left.get().merge(right.get(), k))
                            .orElse(left.get().merge(right.get(), List.of()).lost())));
                }
                return Optional.empty();
            }
            case "DataFrame" -> {
                Optional<CallArgs.Arg> data = args.at(0).or(() -> args.named("data"));
                if (data.isPresent() && data.get().value() instanceof Value.Dict d) {
                    Frame f = Frame.empty();
                    for (Map.Entry<String, Value> e : d.entries().entrySet()) {
                        f = withColumn(f, e.getKey(), e.getValue());
                    }
                    return Optional.of(frame(type, f));
                }
                return Optional.of(frame(type, data.flatMap(a -> PythonEvaluator.frame(a.value())).orElse(Frame.empty().lost())));
            }
            default -> {
                return Optional.empty();
            }
        }
    }

    private static List<Frame> frames(Value items) {
        List<Frame> out = new ArrayList<>();
        if (items instanceof Value.Items it) {
            it.items().forEach(v -> out.addAll(frames(v)));
        } else if (items instanceof Value.Each each && each.values() != null) {
            each.values().forEach(v -> out.addAll(frames(v)));
        } else if (items instanceof Value.OneOf one) {
            one.options().forEach(v -> out.addAll(frames(v)));
        } else {
            PythonEvaluator.frame(items).ifPresent(out::add);
        }
        return out;
    }

    /** Column names from a string or a list of strings. */
    static Optional<List<String>> names(Value v) {
        if (v == null) {
            return Optional.empty();
        }
        Optional<String> one = Values.constant(v);
        if (one.isPresent()) {
            return Optional.of(List.of(one.get()));
        }
        if (v instanceof Value.Items it) {
            List<String> out = new ArrayList<>();
            for (Value item : it.items()) {
                Optional<String> s = Values.constant(item);
                if (s.isEmpty()) {
                    return Optional.empty();
                }
                out.add(s.get());
            }
            return Optional.of(out);
        }
        return Optional.empty();
    }
}
