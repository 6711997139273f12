package org.headwater.analysis.script.r;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.Direction;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.io.IoRule;
import org.headwater.analysis.script.io.IoTable;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;

/** R calls: functions of the script, package functions from the read/write table, builtins, dplyr verbs. */
final class RCalls {
    static final IoTable IO = IoTable.load("r-io.tsv");
    private static final Map<String, List<IoRule>> BY_SIMPLE_NAME = new HashMap<>();
    // reference: R documentation, options("defaultPackages"), from memory
    private static final Set<String> ATTACHED_BY_DEFAULT = Set.of("base", "utils", "stats", "graphics", "grDevices", "methods", "datasets");
    // reference: tidyverse 2 documentation of its core packages, from memory
    private static final Map<String, List<String>> UMBRELLAS = Map.of(
            "tidyverse", List.of("ggplot2", "dplyr", "tidyr", "readr", "purrr", "tibble", "stringr", "forcats", "lubridate"));
    // A package function called without library() nor pkg:: may be another package's same name.
    private static final double NOT_ATTACHED = 0.8;
    static final String FRAME = "data.frame";
    static final String GROUPED = "grouped_df";

    static {
        for (IoRule rule : IO.rules()) {
            BY_SIMPLE_NAME.computeIfAbsent(rule.simpleName(), k -> new ArrayList<>()).add(rule);
        }
    }

    /** A grouped data frame: the frame and its keys. */
    record Grouped(Frame frame, List<String> keys) {
    }

    private final REvaluator ev;
    private final ReferenceMaker refs;
    private final Set<String> attached = new HashSet<>(ATTACHED_BY_DEFAULT);

    RCalls(REvaluator ev, ReferenceMaker refs) {
        this.ev = ev;
        this.refs = refs;
    }

    Value call(Node call, Scope scope, Node piped) {
        if (call == null) {
            return new Value.Unknown("empty pipe");
        }
        if (!call.is("call")) {
            // x |> f is not valid R, but `x %>% f` is magrittr for f(x)
            Value f = ev.eval(call, scope);
            return piped == null ? f : new Value.Unknown("pipe into " + call.text());
        }
        Node fnNode = call.field("function");
        Node argsNode = call.field("arguments");
        List<Node> argNodes = argsNode == null ? List.of() : argsNode.named();
        // R looks a called name up among functions only, so a variable named like a function does not hide it
        Value callee = fnNode.is("identifier")
                ? scope.lookup(fnNode.text()).filter(v -> v instanceof Value.Obj o && o.state() instanceof REvaluator.RFunction)
                        .orElse(new Value.Name(fnNode.text()))
                : ev.eval(fnNode, scope);
        Value pipedValue = piped == null ? null : ev.eval(piped, scope);
        if (callee instanceof Value.Obj o && o.state() instanceof REvaluator.RFunction fn) {
            CallArgs args = arguments(argNodes, scope, pipedValue, piped);
            Map<String, Value> named = new LinkedHashMap<>();
            args.named().forEach((k, v) -> named.put(k, v.value()));
            return ev.invoke(fn, args.positional().stream().map(CallArgs.Arg::value).toList(), named, call);
        }
        if (!(callee instanceof Value.Name name)) {
            arguments(argNodes, scope, pipedValue, piped);
            return new Value.Unknown("call of " + Values.describe(callee));
        }
        String q = name.qualified();
        String simple = q.contains("::") ? q.substring(q.lastIndexOf(':') + 1) : q;
        if (Dplyr.VERBS.contains(simple) && (!q.contains("::") || q.startsWith("dplyr::") || q.startsWith("tidyr::"))) {
            Value data = pipedValue != null ? pipedValue : argNodes.isEmpty() ? new Value.Unknown("no data")
                    : ev.eval(argNodes.get(0), scope);
            List<Node> rest = pipedValue != null ? argNodes : argNodes.isEmpty() ? argNodes : argNodes.subList(1, argNodes.size());
            if (REvaluator.frame(data).isPresent() || data instanceof Value.Obj o2 && o2.state() instanceof Grouped) {
                return new Dplyr(ev, scope).verb(simple, data, rest);
            }
        }
        CallArgs args = arguments(argNodes, scope, pipedValue, piped);
        if (simple.equals("library") || simple.equals("require") || simple.equals("requireNamespace")) {
            args.at(0).ifPresent(a -> attach(a));
            return new Value.Nothing();
        }
        if (simple.equals("return")) {
            Value v = args.at(0).map(CallArgs.Arg::value).orElse(new Value.Nothing());
            ev.returned(v);
            return v;
        }
        if (simple.equals("source")) {
            return RBuiltins.source(args, ev, scope);
        }
        List<IoRule> rules = rulesFor(q);
        if (!rules.isEmpty()) {
            return applyRules(rules, args, call);
        }
        Optional<RBuiltins.Builtin> builtin = RBuiltins.find(simple);
        if (builtin.isPresent() && (!q.contains("::") || q.startsWith("base::") || q.startsWith("here::") || q.startsWith("glue::"))) {
            return builtin.get().apply(args, ev);
        }
        Optional<Value> frameOp = Dplyr.function(simple, args);
        if (frameOp.isPresent()) {
            return frameOp.get();
        }
        return columnResult(args).orElse(new Value.Unknown("result of " + q));
    }

    private void attach(CallArgs.Arg a) {
        String pkg = a.node().is("identifier") ? a.node().text() : Values.constant(a.value()).orElse(null);
        if (pkg != null) {
            attached.add(pkg);
            attached.addAll(UMBRELLAS.getOrDefault(pkg, List.of()));
        }
    }

    private List<IoRule> rulesFor(String q) {
        if (q.contains("::")) {
            return IO.rulesFor(q.replace(":::", "::"));
        }
        return BY_SIMPLE_NAME.getOrDefault(q, List.of());
    }

    private CallArgs arguments(List<Node> nodes, Scope scope, Value piped, Node pipedNode) {
        List<CallArgs.Arg> positional = new ArrayList<>();
        Map<String, CallArgs.Arg> named = new LinkedHashMap<>();
        boolean dotPlaceholder = piped != null && nodes.stream().anyMatch(n -> n.is("identifier") && n.text().equals("."));
        if (piped != null && !dotPlaceholder) {
            positional.add(new CallArgs.Arg(piped, pipedNode));
        }
        boolean dots = false;
        for (Node n : nodes) {
            if (n.is("default_argument")) {
                Node nameNode = n.field("name");
                String key = nameNode.is("string") ? RStrings.literal(nameNode.text()) : nameNode.text();
                Node valueNode = n.field("value");
                named.put(key, new CallArgs.Arg(valueNode == null ? new Value.Nothing() : ev.eval(valueNode, scope), valueNode == null ? n : valueNode));
            } else if (n.is("dots")) {
                dots = true;
            } else if (n.is("identifier") && n.text().equals(".") && piped != null) {
                positional.add(new CallArgs.Arg(piped, pipedNode));
            } else {
                positional.add(new CallArgs.Arg(ev.eval(n, scope), n));
            }
        }
        return new CallArgs(positional, named, dots);
    }

    private Value applyRules(List<IoRule> rules, CallArgs args, Node call) {
        Value result = new Value.Nothing();
        for (IoRule rule : rules) {
            Optional<CallArgs.Arg> path = args.bind(rule.params(), rule.pathParam());
            if (path.isEmpty()) {
                continue;
            }
            String pkg = rule.function().substring(0, rule.function().indexOf("::"));
            boolean explicit = call.field("function").text().contains("::");
            double factor = explicit || attached.contains(pkg) ? 1.0 : NOT_ATTACHED;
            if (rule.simpleName().equals("fromJSON") && Values.constant(path.get().value()).map(s -> s.strip().startsWith("{") || s.strip().startsWith("[")).orElse(false)) {
                continue; // JSON text, not a path
            }
            List<Direction> directions = rule.direction() != null ? List.of(rule.direction())
                    : IoRule.directionsOfMode(args.bind(rule.params(), "open").flatMap(a -> Values.constant(a.value())).orElse(rule.defaultMode()));
            Optional<Node> site = ev.foreignCallSite();
            double where = site.isPresent() ? ReferenceMaker.OTHER_FILE : 1.0;
            List<DataReference> made = new ArrayList<>();
            for (Direction d : directions) {
                made.addAll(refs.make(rule, d, path.get().value(), site.orElse(path.get().node()), site.orElse(call), rule.function(), factor * where));
            }
            for (DataReference ref : made) {
                if (ref.direction() == Direction.WRITE) {
                    frameArgument(args, path.get()).ifPresent(f -> ev.findings().written(ref, f));
                }
            }
            if (rule.returns() != null && rule.returns().equals(FRAME)) {
                List<Frame> reads = made.stream().filter(r -> r.direction() == Direction.READ && r.target() != null)
                        .map(r -> Frame.read(r.target())).toList();
                result = new Value.Obj(FRAME, reads.isEmpty() ? Frame.empty().lost() : Frame.concat(reads));
            }
        }
        return result;
    }

    private static Optional<Frame> frameArgument(CallArgs args, CallArgs.Arg path) {
        List<CallArgs.Arg> all = new ArrayList<>(args.positional());
        all.addAll(args.named().values());
        for (CallArgs.Arg a : all) {
            if (a != path) {
                Optional<Frame> f = REvaluator.frame(a.value());
                if (f.isPresent()) {
                    return f;
                }
                if (a.value() instanceof Value.Obj o && o.state() instanceof Grouped g) {
                    return Optional.of(g.frame());
                }
            }
        }
        return Optional.empty();
    }

    static Optional<Value> columnResult(CallArgs args) {
        List<Origin> origins = new ArrayList<>();
        boolean any = false;
        boolean unknown = false;
        List<CallArgs.Arg> all = new ArrayList<>(args.positional());
        all.addAll(args.named().values());
        for (CallArgs.Arg a : all) {
            Optional<REvaluator.Column> c = REvaluator.column(a.value());
            if (c.isPresent()) {
                any = true;
                c.get().origins().forEach(o -> origins.add(o.asDerived()));
                unknown |= c.get().unknown();
            }
        }
        return any ? Optional.of(new Value.Obj(REvaluator.SERIES, new REvaluator.Column(origins, unknown))) : Optional.empty();
    }

    // ---- members, subsets, assignment

    Value member(Value object, String name) {
        return Values.lift1(object, o -> {
            if (o instanceof Value.Dict d) {
                return d.entries().getOrDefault(name, new Value.Unknown("$" + name + " not set"));
            }
            Optional<Frame> f = REvaluator.frame(o);
            if (f.isPresent()) {
                List<Origin> origins = f.get().origins(name);
                return new Value.Obj(REvaluator.SERIES, new REvaluator.Column(origins == null ? List.of() : origins, origins == null));
            }
            return new Value.Unknown("$" + name + " of " + Values.describe(o));
        });
    }

    Value subset(Node e, Scope scope) {
        List<Node> parts = e.named();
        Value object = ev.eval(parts.get(0), scope);
        Node argsNode = parts.size() > 1 ? parts.get(1) : null;
        List<Node> indexNodes = argsNode == null ? List.of() : argsNode.named();
        if (indexNodes.size() != 1) {
            indexNodes.forEach(n -> ev.eval(n, scope));
            return REvaluator.frame(object).<Value>map(f -> new Value.Obj(FRAME, f.lost())).orElse(new Value.Unknown("subset"));
        }
        Value index = ev.eval(indexNodes.get(0), scope);
        return Values.lift2(object, index, (o, i) -> {
            if (o instanceof Value.Items items && i instanceof Value.Num n) {
                int at = (int) n.value() - 1; // R counts from 1
                return at >= 0 && at < items.items().size() ? items.items().get(at) : new Value.Unknown("index beyond the vector");
            }
            if (o instanceof Value.Unknown u && u.why().startsWith(ReferenceMaker.NO_ARGUMENT)) {
                return new Value.Unknown(ReferenceMaker.NO_ARGUMENT + " (" + e.text() + ")");
            }
            Optional<String> key = Values.constant(i);
            if (key.isPresent()) {
                return member(o, key.get());
            }
            return new Value.Unknown("subset of " + Values.describe(o));
        });
    }

    void assignColumn(Node target, Value v, Scope scope) {
        List<Node> parts = target.named();
        if (parts.isEmpty() || !parts.get(0).is("identifier")) {
            return;
        }
        String var = parts.get(0).text();
        Optional<String> column;
        if (target.is("dollar")) {
            column = parts.size() > 1 ? Optional.of(parts.get(1).text()) : Optional.empty();
        } else {
            List<Node> idx = parts.size() > 1 ? parts.get(1).named() : List.of();
            column = idx.size() == 1 ? Values.constant(ev.eval(idx.get(0), scope)) : Optional.empty();
        }
        Value object = ev.eval(parts.get(0), scope);
        if (REvaluator.frame(object).isPresent()) {
            Frame f = REvaluator.frame(object).get();
            scope.set(var, new Value.Obj(FRAME, column.map(c -> Dplyr.withColumn(f, c, v)).orElse(f.lost())));
        } else if (object instanceof Value.Dict d && column.isPresent()) {
            Map<String, Value> entries = new LinkedHashMap<>(d.entries());
            entries.put(column.get(), v);
            scope.set(var, new Value.Dict(entries));
        }
    }

    Value iterate(Value over) {
        if (over instanceof Value.Items items) {
            return new Value.Each(items.items(), "*");
        }
        if (over instanceof Value.Each each) {
            return each;
        }
        return Value.unknownItem();
    }

    static Value binary(String op, Value a, Value b) {
        if (REvaluator.column(a).isPresent() || REvaluator.column(b).isPresent()) {
            List<Origin> origins = new ArrayList<>();
            boolean unknown = false;
            for (Value v : List.of(a, b)) {
                Optional<REvaluator.Column> c = REvaluator.column(v);
                if (c.isPresent()) {
                    c.get().origins().forEach(o -> origins.add(o.asDerived()));
                    unknown |= c.get().unknown();
                }
            }
            return new Value.Obj(REvaluator.SERIES, new REvaluator.Column(origins, unknown));
        }
        if (a instanceof Value.Num x && b instanceof Value.Num y) {
            double l = x.value();
            double r = y.value();
            return switch (op) {
                case ":" -> range(l, r);
                case "+" -> new Value.Num(l + r, x.integral() && y.integral());
                case "-" -> new Value.Num(l - r, x.integral() && y.integral());
                case "*" -> new Value.Num(l * r, x.integral() && y.integral());
                case "/" -> r == 0 ? new Value.Unknown("division by zero") : new Value.Num(l / r, false);
                case "==" -> new Value.Bool(l == r);
                case "!=" -> new Value.Bool(l != r);
                case "<" -> new Value.Bool(l < r);
                case ">" -> new Value.Bool(l > r);
                case "<=" -> new Value.Bool(l <= r);
                case ">=" -> new Value.Bool(l >= r);
                default -> new Value.Unknown("result of " + op);
            };
        }
        if (op.equals("&&") || op.equals("&") || op.equals("||") || op.equals("|")) {
            Optional<Boolean> l = Values.truth(a);
            Optional<Boolean> r = Values.truth(b);
            boolean and = op.startsWith("&");
            if (l.isPresent() && l.get() != and) {
                return new Value.Bool(!and);
            }
            if (l.isPresent() && r.isPresent()) {
                return new Value.Bool(r.get());
            }
            return new Value.Unknown("logic of values not known");
        }
        Optional<String> l = Values.constant(a);
        Optional<String> r = Values.constant(b);
        if (l.isPresent() && r.isPresent() && (op.equals("==") || op.equals("!="))) {
            return new Value.Bool(l.get().equals(r.get()) == op.equals("=="));
        }
        return new Value.Unknown("result of " + op);
    }

    private static Value range(double from, double to) {
        List<Value> out = new ArrayList<>();
        double step = from <= to ? 1 : -1;
        for (double i = from; step > 0 ? i <= to : i >= to; i += step) {
            out.add(new Value.Num(i, true));
            if (out.size() > 256) {
                return new Value.Unknown("range too long to enumerate");
            }
        }
        return new Value.Items(out);
    }

    static Value.Text text(Value v) {
        return Values.asText(v, Dialect.R);
    }
}
