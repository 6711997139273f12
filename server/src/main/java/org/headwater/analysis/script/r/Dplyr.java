package org.headwater.analysis.script.r;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;

/**
 * dplyr verbs on frames. Their arguments name columns bare (data masking), so they are read from the
 * code, not evaluated as variables. // reference: dplyr 1.1 reference (mutate, transmute, select, rename,
 * filter, arrange, group_by, summarise, *_join, bind_rows), from memory
 */
final class Dplyr {
    static final Set<String> VERBS = Set.of("mutate", "transmute", "select", "rename", "filter", "arrange", "distinct",
            "slice", "slice_head", "slice_tail", "slice_max", "slice_min", "ungroup", "group_by", "summarise", "summarize",
            "left_join", "right_join", "inner_join", "full_join", "semi_join", "anti_join", "count", "pivot_longer",
            "pivot_wider", "group_modify", "nest", "unnest", "reframe", "drop_na", "relocate", "collect");
    private static final Set<String> ROWS_ONLY = Set.of("filter", "arrange", "distinct", "slice", "slice_head",
            "slice_tail", "slice_max", "slice_min", "semi_join", "anti_join", "drop_na", "relocate", "collect");

    private final REvaluator ev;
    private final Scope scope;

    Dplyr(REvaluator ev, Scope scope) {
        this.ev = ev;
        this.scope = scope;
    }

    Value verb(String verb, Value data, List<Node> args) {
        if (data instanceof Value.Obj o && o.state() instanceof RCalls.Grouped g) {
            return grouped(verb, g, args);
        }
        Frame f = REvaluator.frame(data).orElseThrow();
        if (ROWS_ONLY.contains(verb)) {
            args.forEach(a -> masked(f, a));
            return frame(f);
        }
        return switch (verb) {
            case "ungroup" -> frame(f);
            case "mutate" -> frame(mutate(f, args));
            case "transmute" -> {
                Frame m = mutate(f, args);
                yield frame(m.select(names(args)));
            }
            case "select" -> frame(select(f, args));
            case "rename" -> {
                Map<String, String> map = new LinkedHashMap<>();
                for (Node a : args) {
                    if (a.is("default_argument") && a.field("value") != null) {
                        map.put(a.field("value").text(), a.field("name").text());
                    }
                }
                yield frame(f.rename(map));
            }
            case "group_by" -> new Value.Obj(RCalls.GROUPED, new RCalls.Grouped(f, bareNames(args)));
            case "summarise", "summarize", "count" -> frame(summarise(f, List.of(), args, verb.equals("count")));
            case "left_join", "right_join", "inner_join", "full_join" -> frame(join(f, args));
            default -> frame(f.lost());
        };
    }

    private Value grouped(String verb, RCalls.Grouped g, List<Node> args) {
        return switch (verb) {
            case "summarise", "summarize" -> frame(summarise(g.frame(), g.keys(), args, false));
            case "count" -> frame(summarise(g.frame(), g.keys(), args, true));
            case "ungroup" -> frame(g.frame());
            case "mutate" -> new Value.Obj(RCalls.GROUPED, new RCalls.Grouped(mutate(g.frame(), args), g.keys()));
            case "filter", "arrange", "slice", "slice_head", "slice_tail", "slice_max", "slice_min" -> new Value.Obj(RCalls.GROUPED, g);
            default -> frame(g.frame().lost());
        };
    }

    private static Value frame(Frame f) {
        return new Value.Obj(RCalls.FRAME, f);
    }

    private Frame mutate(Frame f, List<Node> args) {
        Frame out = f;
        for (Node a : args) {
            if (!a.is("default_argument")) {
                out = out.lost(); // across(), pick(): outputs not named in the code
                continue;
            }
            String name = a.field("name").text();
            if (name.startsWith(".")) {
                continue; // .by, .keep: options, not columns
            }
            out = withColumn(out, name, masked(out, a.field("value")));
        }
        return out;
    }

    private Frame select(Frame f, List<Node> args) {
        List<String> keep = new ArrayList<>();
        Map<String, String> renames = new LinkedHashMap<>();
        List<String> dropped = new ArrayList<>();
        for (Node a : args) {
            if (a.is("identifier")) {
                keep.add(a.text());
            } else if (a.is("string")) {
                keep.add(RStrings.literal(a.text()));
            } else if (a.is("default_argument") && a.field("value") != null && a.field("value").is("identifier")) {
                renames.put(a.field("value").text(), a.field("name").text());
                keep.add(a.field("name").text());
            } else if (a.is("unary") && a.field("operand") != null && a.field("operand").is("identifier")) {
                dropped.add(a.field("operand").text());
            } else if (a.is("call") && a.field("function").text().equals("c")) {
                a.field("arguments").named().stream().filter(n -> n.is("identifier")).forEach(n -> keep.add(n.text()));
            } else {
                return f.lost(); // tidyselect helpers (starts_with, where, everything) need the data
            }
        }
        if (!dropped.isEmpty() && keep.isEmpty()) {
            return f.drop(dropped);
        }
        return f.rename(renames).select(keep);
    }

    private Frame summarise(Frame f, List<String> keys, List<Node> args, boolean count) {
        Map<String, List<String>> used = new LinkedHashMap<>();
        Frame keysFrame = f.aggregate(keys, Map.of());
        Map<String, List<Origin>> columns = new LinkedHashMap<>(keysFrame.columns());
        boolean unknown = keysFrame.opaque();
        if (count) {
            bareNames(args).forEach(k -> Optional.ofNullable(f.origins(k)).ifPresent(o -> columns.put(k, o)));
            columns.put("n", List.of());
        }
        for (Node a : args) {
            if (!a.is("default_argument") || count) {
                continue;
            }
            String name = a.field("name").text();
            if (name.startsWith(".")) {
                continue; // .groups
            }
            Value v = masked(f, a.field("value"));
            Optional<REvaluator.Column> c = REvaluator.column(v);
            columns.put(name, c.map(col -> col.origins().stream().map(Origin::asDerived).toList()).orElse(List.of()));
            unknown |= c.map(REvaluator.Column::unknown).orElse(false);
        }
        used.clear();
        return new Frame(f.sources(), columns, Map.of(), unknown);
    }

    private Frame join(Frame left, List<Node> args) {
        if (args.isEmpty()) {
            return left.lost();
        }
        Value right = ev.eval(args.get(0), scope);
        Optional<Frame> r = REvaluator.frame(right);
        List<String> by = new ArrayList<>();
        for (Node a : args) {
            if (a.is("default_argument") && a.field("name").text().equals("by")) {
                Node v = a.field("value");
                if (v.is("call") && v.field("function").text().equals("join_by")) {
                    v.field("arguments").named().stream().filter(n -> n.is("identifier")).forEach(n -> by.add(n.text()));
                } else {
                    Value value = ev.eval(v, scope);
                    if (value instanceof Value.Items it) {
                        it.items().forEach(i -> Values.constant(i).ifPresent(by::add));
                    } else {
                        Values.constant(value).ifPresent(by::add);
                    }
                }
            }
        }
        if (r.isEmpty() || by.isEmpty()) {
            return r.map(rf -> left.merge(rf, List.of()).lost()).orElse(left.lost());
        }
        return left.merge(r.get(), by);
    }

    /** Evaluates an argument with bare names standing for the frame's columns, as dplyr does. */
    Value masked(Frame f, Node expression) {
        if (expression == null) {
            return new Value.Nothing();
        }
        Scope mask = new Scope(scope);
        for (String id : identifiers(expression)) {
            List<Origin> o = f.origins(id);
            if (o != null) {
                mask.set(id, new Value.Obj(REvaluator.SERIES, new REvaluator.Column(o, false)));
            } else if (scope.lookup(id).isEmpty()) {
                mask.set(id, new Value.Obj(REvaluator.SERIES, new REvaluator.Column(List.of(), true)));
            }
        }
        return ev.eval(expression, mask);
    }

    /** Names used as values in an expression: not called functions, not argument names. */
    private static Set<String> identifiers(Node n) {
        Set<String> out = new LinkedHashSet<>();
        collect(n, out);
        return out;
    }

    private static void collect(Node n, Set<String> out) {
        if (n.is("identifier")) {
            out.add(n.text());
            return;
        }
        if (n.is("call")) {
            Node args = n.field("arguments");
            if (args != null) {
                collect(args, out);
            }
            return;
        }
        if (n.is("default_argument")) {
            if (n.field("value") != null) {
                collect(n.field("value"), out);
            }
            return;
        }
        if (n.is("namespace_get") || n.is("string")) {
            return;
        }
        n.named().forEach(c -> collect(c, out));
    }

    private static List<String> names(List<Node> args) {
        List<String> out = new ArrayList<>();
        for (Node a : args) {
            if (a.is("default_argument") && !a.field("name").text().startsWith(".")) {
                out.add(a.field("name").text());
            }
        }
        return out;
    }

    private static List<String> bareNames(List<Node> args) {
        List<String> out = new ArrayList<>();
        for (Node a : args) {
            if (a.is("identifier")) {
                out.add(a.text());
            } else if (a.is("string")) {
                out.add(RStrings.literal(a.text()));
            }
        }
        return out;
    }

    /** A column set from a value: a column keeps its origins, a constant has none. */
    static Frame withColumn(Frame f, String name, Value v) {
        Optional<REvaluator.Column> c = REvaluator.column(v);
        Frame dropped = f.drop(List.of(name));
        Map<String, List<Origin>> columns = new LinkedHashMap<>(dropped.columns());
        if (c.isPresent()) {
            columns.put(name, c.get().origins());
            return new Frame(f.sources(), columns, f.passThrough(), f.opaque() || c.get().unknown());
        }
        if (v instanceof Value.Num || v instanceof Value.Text || v instanceof Value.Bool) {
            columns.put(name, List.of());
            return new Frame(f.sources(), columns, f.passThrough(), f.opaque());
        }
        return new Frame(f.sources(), columns, f.passThrough(), true);
    }

    /** Base and dplyr functions that combine frames given as arguments. */
    static Optional<Value> function(String name, CallArgs args) {
        switch (name) {
            case "bind_rows", "rbind" -> {
                List<Frame> frames = new ArrayList<>();
                args.positional().forEach(a -> REvaluator.frame(a.value()).ifPresent(frames::add));
                return frames.isEmpty() ? Optional.empty() : Optional.of(frame(Frame.concat(frames)));
            }
            case "merge" -> {
                Optional<Frame> x = args.at(0).flatMap(a -> REvaluator.frame(a.value()));
                Optional<Frame> y = args.at(1).flatMap(a -> REvaluator.frame(a.value()));
                Optional<String> by = args.named("by").flatMap(a -> Values.constant(a.value()));
                if (x.isPresent() && y.isPresent()) {
                    return Optional.of(frame(by.map(k -> x.get().merge(y.get(), List.of(k))).orElse(x.get().merge(y.get(), List.of()).lost())));
                }
                return Optional.empty();
            }
            case "data.frame", "tibble", "data.table" -> {
                Frame f = Frame.empty();
                for (Map.Entry<String, CallArgs.Arg> e : args.named().entrySet()) {
                    f = withColumn(f, e.getKey(), e.getValue().value());
                }
                return Optional.of(frame(args.positional().isEmpty() ? f : f.lost()));
            }
            default -> {
                return Optional.empty();
            }
        }
    }
}
