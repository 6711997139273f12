package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.Direction;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.io.IoKind;
import org.headwater.analysis.script.io.IoRule;
import org.headwater.analysis.script.io.IoTable;
import org.headwater.analysis.script.io.TypeTable;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.PathText;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Obj;
import org.headwater.analysis.script.value.Values;

/** Python calls, attributes, subscripts and operators: where the read/write table is consulted. */
final class PythonCalls {
    static final IoTable IO = IoTable.load("python-io.tsv");
    static final TypeTable TYPES = TypeTable.load("python-types.tsv");
    // How sure a call on a receiver whose type was tracked is, against a qualified function (1.0).
    private static final double TRACKED_RECEIVER = 0.95;
    // Mixed values: both a read and a write are possible when the mode is not a constant.
    private static final double UNKNOWN_MODE = 0.5;

    private final PythonEvaluator ev;
    private final ReferenceMaker refs;

    PythonCalls(PythonEvaluator ev, ReferenceMaker refs) {
        this.ev = ev;
        this.refs = refs;
    }

    // ---- calls

    Value call(Node call, Scope scope) {
        Node fn = call.field("function");
        CallArgs args = arguments(call.field("arguments"), scope);
        if (fn.is("attribute")) {
            Node objectNode = fn.field("object");
            String method = fn.field("attribute").text();
            Value receiver = ev.eval(objectNode, scope);
            return Values.lift1(receiver, r -> method(call, objectNode, r, method, args, scope));
        }
        Value callee = ev.eval(fn, scope);
        return Values.lift1(callee, c -> function(call, c, args));
    }

    private CallArgs arguments(Node list, Scope scope) {
        List<CallArgs.Arg> positional = new ArrayList<>();
        Map<String, CallArgs.Arg> named = new LinkedHashMap<>();
        boolean splat = false;
        if (list == null) {
            return new CallArgs(positional, named, false);
        }
        if (list.is("generator_expression")) {
            return new CallArgs(List.of(new CallArgs.Arg(ev.eval(list, scope), list)), named, false);
        }
        for (Node a : list.named()) {
            switch (a.type()) {
                case "keyword_argument" -> named.put(a.field("name").text(), new CallArgs.Arg(ev.eval(a.field("value"), scope), a.field("value")));
                case "list_splat", "dictionary_splat" -> {
                    ev.eval(a.firstNamed(), scope);
                    splat = true;
                }
                default -> positional.add(new CallArgs.Arg(ev.eval(a, scope), a));
            }
        }
        return new CallArgs(positional, named, splat);
    }

    private Value function(Node call, Value callee, CallArgs args) {
        if (callee instanceof Obj o && o.state() instanceof PyObjects.Function f) {
            Map<String, Value> named = new LinkedHashMap<>();
            args.named().forEach((k, v) -> named.put(k, v.value()));
            return ev.invoke(f, args.positional().stream().map(CallArgs.Arg::value).toList(), named, call);
        }
        if (callee instanceof Obj o && o.state() instanceof PyObjects.Lambda l) {
            return ev.invokeLambda(l, args.positional().stream().map(CallArgs.Arg::value).toList());
        }
        if (!(callee instanceof Value.Name name)) {
            return new Value.Unknown("call of " + Values.describe(callee));
        }
        String q = name.qualified();
        List<IoRule> rules = IO.rulesFor(q);
        if (!rules.isEmpty()) {
            return applyRules(rules, null, null, args, call, q, 1.0);
        }
        Optional<PyBuiltins.Builtin> builtin = PyBuiltins.find(q);
        if (builtin.isPresent()) {
            return builtin.get().apply(args, ev);
        }
        if (q.startsWith("pandas.") || q.startsWith("polars.")) {
            Optional<Value> combined = PandasOps.function(q, args);
            if (combined.isPresent()) {
                return combined.get();
            }
        }
        if (q.equals(PyObjects.PARSER)) {
            return new Obj(PyObjects.PARSER, new Argparse());
        }
        Optional<String> type = TYPES.returnOf(q);
        if (type.isPresent()) {
            return typed(type.get());
        }
        return seriesResult(args).orElse(new Value.Unknown("result of " + q));
    }

    private Value method(Node call, Node objectNode, Value receiver, String method, CallArgs args, Scope scope) {
        if (receiver instanceof Value.Name n) {
            return function(call, new Value.Name(n.qualified() + "." + method), args);
        }
        if (receiver instanceof Obj o) {
            return objectMethod(call, objectNode, o, method, args);
        }
        if (receiver instanceof Value.PathValue p) {
            return pathMethod(call, objectNode, p, method, args);
        }
        if (receiver instanceof Value.Text t) {
            return StrMethods.apply(t, method, args);
        }
        if (receiver instanceof Value.Items items && objectNode.is("identifier")) {
            if (method.equals("append") || method.equals("extend")) {
                List<Value> more = new ArrayList<>(items.items());
                Value added = args.at(0).map(CallArgs.Arg::value).orElse(new Value.Unknown("appended"));
                if (method.equals("extend") && added instanceof Value.Items extra) {
                    more.addAll(extra.items());
                } else {
                    more.add(added);
                }
                scope.set(objectNode.text(), new Value.Items(more));
                return new Value.Nothing();
            }
            return new Value.Unknown("list method " + method);
        }
        return unknownReceiver(call, objectNode, receiver, method, args);
    }

    private Value objectMethod(Node call, Node objectNode, Obj o, String method, CallArgs args) {
        if (o.state() instanceof PyObjects.Module m) {
            return function(call, m.scope().lookup(method).orElse(new Value.Name(m.name() + "." + method)), args);
        }
        if (o.state() instanceof Argparse parser) {
            return argparseMethod(parser, o, method, args);
        }
        if (o.state() instanceof PyObjects.GroupBy g) {
            return PandasOps.groupMethod(g, method, args);
        }
        if (o.state() instanceof PyObjects.Series s) {
            List<IoRule> rules = IO.anyReceiverRules(method);
            if (!rules.isEmpty()) {
                return applyRules(rules, o, objectNode, args, call, "*." + method, 1.0);
            }
            return PythonEvaluator.seriesOf(s.origins().stream().map(Origin::asDerived).toList(), s.unknown());
        }
        String qualified = o.type() + "." + method;
        List<IoRule> rules = IO.rulesFor(qualified);
        if (!rules.isEmpty()) {
            return applyRules(rules, o, objectNode, args, call, qualified, TRACKED_RECEIVER);
        }
        if (o.state() instanceof Frame f) {
            Optional<Value> op = PandasOps.method(o, f, method, args, ev);
            if (op.isPresent()) {
                return op.get();
            }
        }
        Optional<String> type = TYPES.returnOf(qualified);
        if (type.isPresent()) {
            if (o.state() instanceof Frame f && type.get().equals(o.type())) {
                return new Obj(o.type(), f.lost()); // a frame method the analysis does not follow
            }
            if (o.state() instanceof Frame f && type.get().endsWith("Frame")) {
                return new Obj(type.get(), f);
            }
            return typed(type.get());
        }
        return unknownReceiver(call, objectNode, o, method, args);
    }

    private Value unknownReceiver(Node call, Node objectNode, Value receiver, String method, CallArgs args) {
        List<IoRule> rules = IO.anyReceiverRules(method);
        if (!rules.isEmpty()) {
            return applyRules(rules, receiver, objectNode, args, call, "*." + method, 1.0);
        }
        return seriesResult(args).orElse(new Value.Unknown("result of ." + method + " on " + Values.describe(receiver)));
    }

    private Value pathMethod(Node call, Node objectNode, Value.PathValue p, String method, CallArgs args) {
        String qualified = "pathlib.Path." + method;
        List<IoRule> rules = IO.rulesFor(qualified);
        if (!rules.isEmpty()) {
            return applyRules(rules, p, objectNode, args, call, qualified, 1.0);
        }
        Optional<String> arg = args.at(0).flatMap(a -> Values.constant(a.value()));
        return switch (method) {
            case "joinpath" -> new Value.PathValue(PathText.join(concat(p.text(),
                    args.positional().stream().map(a -> Values.asText(a.value(), Dialect.PYTHON)).toList())));
            case "with_suffix" -> arg.flatMap(s -> PathText.withSuffix(p.text(), s)).<Value>map(Value.PathValue::new)
                    .orElse(new Value.Unknown("with_suffix"));
            case "with_name" -> PathText.parent(p.text()).<Value>map(parent -> new Value.PathValue(PathText.join(
                    List.of(parent, Values.asText(args.at(0).map(CallArgs.Arg::value).orElse(new Value.Unknown("name")), Dialect.PYTHON)))))
                    .orElse(new Value.Unknown("with_name"));
            case "resolve", "absolute", "expanduser" -> {
                Value abs = PyBuiltins.TABLE.get("os.path.abspath").apply(new CallArgs(List.of(new CallArgs.Arg(p.text(), objectNode)), Map.of(), false), ev);
                yield abs instanceof Value.Text t ? new Value.PathValue(t) : abs;
            }
            case "glob", "rglob" -> arg.<Value>map(pattern -> new Value.Each(null, org.headwater.analysis.script.value.Rendered.of(
                    PathText.join(List.of(p.text(), Values.lit(method.equals("rglob") ? "**/" + pattern : pattern)))).pattern()))
                    .orElse(Value.unknownItem());
            case "iterdir" -> new Value.Each(null, org.headwater.analysis.script.value.Rendered.of(PathText.join(List.of(p.text(), Values.lit("*")))).pattern());
            default -> new Value.Unknown("Path." + method);
        };
    }

    private static List<Value.Text> concat(Value.Text head, List<Value.Text> tail) {
        List<Value.Text> all = new ArrayList<>();
        all.add(head);
        all.addAll(tail);
        return all;
    }

    private Value argparseMethod(Argparse parser, Obj self, String method, CallArgs args) {
        switch (method) {
            case "add_argument" -> {
                List<String> flags = new ArrayList<>();
                args.positional().forEach(a -> Values.constant(a.value()).ifPresent(flags::add));
                Map<String, Value> named = new LinkedHashMap<>();
                args.named().forEach((k, v) -> named.put(k, v.value()));
                parser.add(flags, named);
                return new Value.Nothing();
            }
            case "add_argument_group", "add_mutually_exclusive_group" -> {
                return self;
            }
            case "parse_args" -> {
                return new Obj(PyObjects.NAMESPACE, new PyObjects.Namespace(parser.parse(argv(args))));
            }
            case "parse_known_args" -> {
                return new Value.Items(List.of(new Obj(PyObjects.NAMESPACE, new PyObjects.Namespace(parser.parse(argv(args)))),
                        new Value.Items(List.of())));
            }
            default -> {
                return new Value.Nothing();
            }
        }
    }

    /** The command line argparse reads: a literal list given to parse_args, else the driver's. */
    private List<String> argv(CallArgs args) {
        Optional<CallArgs.Arg> given = args.at(0).or(() -> args.named("args"));
        if (given.isPresent() && given.get().value() instanceof Value.Items items) {
            List<String> out = new ArrayList<>();
            items.items().forEach(i -> out.add(Values.constant(i).orElse(null)));
            return out;
        }
        return ev.run().argv();
    }

    private static Value typed(String type) {
        if (type.startsWith("tuple:")) {
            List<Value> parts = new ArrayList<>();
            for (String t : type.substring(6).split(",")) {
                parts.add(new Obj(t.trim(), null));
            }
            return new Value.Items(parts);
        }
        if (type.equals(PyObjects.PARSER)) {
            return new Obj(type, new Argparse());
        }
        return new Obj(type, type.endsWith("DataFrame") || type.endsWith("LazyFrame") ? Frame.empty().lost() : null);
    }

    /** A call on column values (pd.to_datetime(df.x), np.where(...)) gives a value derived from their columns. */
    private static Optional<Value> seriesResult(CallArgs args) {
        List<Origin> origins = new ArrayList<>();
        boolean any = false;
        boolean unknown = false;
        List<CallArgs.Arg> all = new ArrayList<>(args.positional());
        all.addAll(args.named().values());
        for (CallArgs.Arg a : all) {
            Optional<PyObjects.Series> s = PythonEvaluator.series(a.value());
            if (s.isPresent()) {
                any = true;
                s.get().origins().forEach(o -> origins.add(o.asDerived()));
                unknown |= s.get().unknown();
            }
        }
        return any ? Optional.of(PythonEvaluator.seriesOf(origins, unknown)) : Optional.empty();
    }

    // ---- the read/write table

    private Value applyRules(List<IoRule> rules, Value receiver, Node receiverNode, CallArgs args, Node call,
            String function, double factor) {
        Value result = null;
        for (IoRule rule : rules) {
            Optional<CallArgs.Arg> path = rule.pathParam().equals("self")
                    ? Optional.ofNullable(receiver).map(r -> new CallArgs.Arg(r, receiverNode))
                    : args.bind(rule.params(), rule.pathParam());
            if (path.isEmpty()) {
                continue; // no path given: a write to a string or a buffer the call returns
            }
            if (rule.kind() == IoKind.STREAM && path.get().value() instanceof Obj o && o.state() instanceof PyObjects.Handle) {
                continue; // the open() that made this file object already made the reference
            }
            String qualified = rule.anyReceiver() ? function : rule.function();
            Optional<Node> site = ev.foreignCallSite();
            List<DataReference> made = new ArrayList<>();
            for (Direction d : directions(rule, args, call)) {
                double f = factor * (rule.direction() == null && !modeKnown(rule, args) ? UNKNOWN_MODE : 1.0)
                        * (site.isPresent() ? ReferenceMaker.OTHER_FILE : 1.0);
                made.addAll(refs.make(rule, d, path.get().value(), site.orElse(path.get().node()), site.orElse(call), qualified, f));
            }
            for (DataReference ref : made) {
                if (ref.direction() == Direction.WRITE) {
                    writtenFrame(rule, receiver, args).ifPresent(frame -> findings().written(ref, frame));
                }
            }
            Value r = resultOf(rule, made);
            if (r != null) {
                result = r;
            }
        }
        return result == null ? new Value.Nothing() : result;
    }

    private Findings findings() {
        return ev.findings();
    }

    private static Optional<Frame> writtenFrame(IoRule rule, Value receiver, CallArgs args) {
        if (receiver != null) {
            return PythonEvaluator.frame(receiver);
        }
        // a module function writing a frame passed to it: pq.write_table(table, where)
        String first = rule.params().isEmpty() ? null : rule.params().get(0);
        if (first == null || first.equals(rule.pathParam())) {
            return Optional.empty();
        }
        return args.bind(rule.params(), first).flatMap(a -> PythonEvaluator.frame(a.value()));
    }

    private static Value resultOf(IoRule rule, List<DataReference> made) {
        if (rule.returns() == null) {
            return null;
        }
        if (rule.returns().equals(PyObjects.HANDLE)) {
            return new Obj(PyObjects.HANDLE, new PyObjects.Handle(made));
        }
        if (rule.returns().endsWith("DataFrame") || rule.returns().endsWith("LazyFrame") || rule.returns().endsWith("Table")) {
            List<Frame> reads = made.stream().filter(r -> r.direction() == Direction.READ && r.target() != null)
                    .map(r -> Frame.read(r.target())).toList();
            return new Obj(rule.returns(), reads.isEmpty() ? Frame.empty().lost() : Frame.concat(reads));
        }
        return new Obj(rule.returns(), null);
    }

    private static boolean modeKnown(IoRule rule, CallArgs args) {
        Optional<CallArgs.Arg> mode = args.bind(rule.params(), "mode");
        return mode.isEmpty() || Values.constant(mode.get().value()).isPresent();
    }

    private List<Direction> directions(IoRule rule, CallArgs args, Node call) {
        if (rule.direction() != null) {
            return List.of(rule.direction());
        }
        Optional<CallArgs.Arg> mode = args.bind(rule.params(), "mode");
        if (mode.isEmpty()) {
            return IoRule.directionsOfMode(rule.defaultMode());
        }
        Optional<String> constant = Values.constant(mode.get().value());
        if (constant.isEmpty()) {
            findings().warn("line " + call.line() + ": file mode not known, counted as both read and write: " + mode.get().node().text());
            return List.of(Direction.READ, Direction.WRITE);
        }
        return IoRule.directionsOfMode(constant.get());
    }

    // ---- attributes, subscripts, operators

    Value attribute(Value object, String attr, Node node) {
        return Values.lift1(object, o -> attributeOf(o, attr));
    }

    private Value attributeOf(Value o, String attr) {
        if (o instanceof Value.Name n) {
            if (n.qualified().equals("sys") && attr.equals("argv")) {
                return argvItems();
            }
            if (n.qualified().equals("os") && attr.equals("sep")) {
                return Values.lit("/");
            }
            return new Value.Name(n.qualified() + "." + attr);
        }
        if (o instanceof Value.PathValue p) {
            return switch (attr) {
                case "parent" -> PathText.parent(p.text()).<Value>map(Value.PathValue::new).orElse(new Value.Unknown("parent"));
                case "name" -> PathText.name(p.text()).<Value>map(t -> t).orElse(new Value.Unknown("name"));
                default -> new Value.Unknown("Path." + attr);
            };
        }
        if (o instanceof Obj obj) {
            if (obj.state() instanceof PyObjects.Module m) {
                return m.scope().lookup(attr).orElse(new Value.Name(m.name() + "." + attr));
            }
            if (obj.state() instanceof PyObjects.Namespace ns) {
                return ns.values().getOrDefault(attr, new Value.Unknown("args." + attr + " is not declared"));
            }
            if (obj.state() instanceof Frame f) {
                List<Origin> origins = f.origins(attr);
                return PythonEvaluator.seriesOf(origins == null ? List.of() : origins, origins == null);
            }
            if (obj.state() instanceof PyObjects.Series s) {
                return PythonEvaluator.seriesOf(s.origins(), s.unknown()); // .dt, .str accessors
            }
            Optional<String> type = TYPES.exactly(obj.type() + "." + attr);
            if (type.isPresent()) {
                return typed(type.get());
            }
        }
        return new Value.Unknown("attribute " + attr + " of " + Values.describe(o));
    }

    private Value argvItems() {
        List<String> argv = ev.run().argv();
        if (argv == null) {
            return new Value.Unknown(ReferenceMaker.NO_ARGUMENT + " (sys.argv)");
        }
        List<Value> items = new ArrayList<>();
        items.add(Values.lit(ev.run().script().toString()));
        argv.forEach(a -> items.add(a == null ? new Value.Unknown("argument computed by the driver") : Values.lit(a)));
        return new Value.Items(items);
    }

    Value subscript(Node e, Scope scope) {
        Value object = ev.eval(e.field("value"), scope);
        List<Node> indexes = e.fields("subscript");
        if (indexes.size() != 1) {
            indexes.forEach(i -> ev.eval(i, scope));
            return new Value.Unknown("multi-dimensional subscript");
        }
        Node indexNode = indexes.get(0);
        if (indexNode.is("slice")) {
            return Values.lift1(object, o -> slice(o, indexNode, scope));
        }
        Value index = ev.eval(indexNode, scope);
        return Values.lift2(object, index, this::index);
    }

    private Value slice(Value o, Node slice, Scope scope) {
        if (o instanceof Value.Unknown u) {
            return u;
        }
        if (!(o instanceof Value.Items items)) {
            return o instanceof Obj obj && obj.state() instanceof Frame ? o : new Value.Unknown("slice");
        }
        List<Node> parts = new ArrayList<>();
        Node current = null;
        for (Node c : slice.children()) {
            if (c.text().equals(":")) {
                parts.add(current);
                current = null;
            } else {
                current = c;
            }
        }
        parts.add(current);
        int n = items.items().size();
        Integer from = sliceBound(parts.get(0), scope, n);
        Integer to = parts.size() > 1 ? sliceBound(parts.get(1), scope, n) : null;
        int a = from == null ? 0 : from;
        int b = to == null ? n : to;
        if (parts.size() > 2 && parts.get(2) != null) {
            return new Value.Unknown("slice with a step");
        }
        return new Value.Items(items.items().subList(Math.max(0, Math.min(a, n)), Math.max(0, Math.min(b, n))));
    }

    private Integer sliceBound(Node n, Scope scope, int size) {
        if (n == null) {
            return null;
        }
        Value v = ev.eval(n, scope);
        if (v instanceof Value.Num num) {
            int i = (int) num.value();
            return i < 0 ? size + i : i;
        }
        return null;
    }

    private Value index(Value o, Value i) {
        if (o instanceof Value.Items items && i instanceof Value.Num n) {
            int at = (int) n.value();
            int size = items.items().size();
            int real = at < 0 ? size + at : at;
            return real >= 0 && real < size ? items.items().get(real) : new Value.Unknown("index " + at + " beyond the list");
        }
        if (o instanceof Value.Unknown u && u.why().startsWith(ReferenceMaker.NO_ARGUMENT)) {
            return new Value.Unknown(ReferenceMaker.NO_ARGUMENT + " (item " + Values.constant(Values.asText(i, Dialect.PYTHON)).orElse("?") + ")");
        }
        if (o instanceof Value.Dict d) {
            return Values.constant(i).map(k -> d.entries().getOrDefault(k, new Value.Unknown("key " + k))).orElse(new Value.Unknown("dict key"));
        }
        if (o instanceof Value.Each each && i instanceof Value.Num) {
            return PythonEvaluator.item(each, (int) ((Value.Num) i).value());
        }
        if (o instanceof Obj obj && obj.state() instanceof Frame f) {
            Optional<String> column = Values.constant(i);
            if (column.isPresent()) {
                List<Origin> origins = f.origins(column.get());
                return PythonEvaluator.seriesOf(origins == null ? List.of() : origins, origins == null);
            }
            Optional<List<String>> columns = PandasOps.names(i);
            if (columns.isPresent()) {
                return new Obj(obj.type(), f.select(columns.get()));
            }
            return new Obj(obj.type(), f); // a row mask keeps every column
        }
        if (o instanceof Obj obj && obj.state() instanceof PyObjects.GroupBy g) {
            return new Obj(PyObjects.GROUPBY, new PyObjects.GroupBy(g.frame(), g.keys(), Values.constant(i).orElse(null)));
        }
        if (o instanceof Obj obj && obj.state() instanceof PyObjects.Series) {
            return o;
        }
        return new Value.Unknown("item of " + Values.describe(o));
    }

    /** {@code df['b'] = ...}: a new or replaced column. */
    void assignColumn(Node target, Value v, Scope scope) {
        Node objectNode = target.field("value");
        if (!objectNode.is("identifier")) {
            return;
        }
        Value object = ev.eval(objectNode, scope);
        Node indexNode = target.field("subscript");
        Optional<String> column = indexNode == null ? Optional.empty() : Values.constant(ev.eval(indexNode, scope));
        if (object instanceof Obj o && o.state() instanceof Frame f) {
            Frame next = column.map(c -> PandasOps.withColumn(f, c, v)).orElse(f.lost());
            scope.set(objectNode.text(), new Obj(o.type(), next));
        } else if (object instanceof Value.Dict d && column.isPresent()) {
            Map<String, Value> entries = new LinkedHashMap<>(d.entries());
            entries.put(column.get(), v);
            scope.set(objectNode.text(), new Value.Dict(entries));
        }
    }

    /** What a for loop's variable is over a collection. */
    Value iterate(Value iterable) {
        if (iterable instanceof Value.Items items) {
            return new Value.Each(items.items(), "*");
        }
        if (iterable instanceof Value.Each each) {
            return each;
        }
        if (iterable instanceof Value.Dict d) {
            return new Value.Each(d.entries().keySet().stream().map(k -> (Value) Values.lit(k)).toList(), "*");
        }
        if (iterable instanceof Value.OneOf one) {
            List<Value> all = new ArrayList<>();
            for (Value option : one.options()) {
                Value item = iterate(option);
                if (item instanceof Value.Each e && e.values() != null) {
                    all.addAll(e.values());
                } else {
                    return Value.unknownItem();
                }
            }
            return new Value.Each(all, "*");
        }
        return Value.unknownItem();
    }

    Value binary(String op, Value left, Value right) {
        return Values.lift2(left, right, (l, r) -> binaryOf(op, l, r));
    }

    private Value binaryOf(String op, Value l, Value r) {
        if (PythonEvaluator.series(l).isPresent() || PythonEvaluator.series(r).isPresent()) {
            List<Origin> origins = new ArrayList<>();
            boolean unknown = false;
            for (Value v : List.of(l, r)) {
                Optional<PyObjects.Series> s = PythonEvaluator.series(v);
                if (s.isPresent()) {
                    s.get().origins().forEach(o -> origins.add(o.asDerived()));
                    unknown |= s.get().unknown();
                }
            }
            return PythonEvaluator.seriesOf(origins, unknown);
        }
        if (op.equals("/") && (l instanceof Value.PathValue || r instanceof Value.PathValue)) {
            return new Value.PathValue(PathText.join(List.of(Values.asText(l, Dialect.PYTHON), Values.asText(r, Dialect.PYTHON))));
        }
        if (op.equals("%") && l instanceof Value.Text t && Values.constant(t).isPresent()) {
            List<Value> args = r instanceof Value.Items items ? items.items() : List.of(r);
            return PyFormat.percent(Values.constant(t).get(), args);
        }
        if (l instanceof Value.Num a && r instanceof Value.Num b) {
            return arithmetic(op, a, b);
        }
        if (op.equals("+") && (l instanceof Value.Text || r instanceof Value.Text)) {
            return Values.concat(Values.asText(l, Dialect.PYTHON), Values.asText(r, Dialect.PYTHON));
        }
        if (op.equals("+") && l instanceof Value.Items a && r instanceof Value.Items b) {
            List<Value> all = new ArrayList<>(a.items());
            all.addAll(b.items());
            return new Value.Items(all);
        }
        if (l instanceof Value.Each each && each.values() != null && r instanceof Value.Num) {
            return new Value.Each(each.values().stream().map(v -> binaryOf(op, v, r)).toList(), "*");
        }
        return new Value.Unknown("result of " + op);
    }

    private static Value arithmetic(String op, Value.Num a, Value.Num b) {
        boolean integral = a.integral() && b.integral();
        double x = a.value();
        double y = b.value();
        return switch (op) {
            case "+" -> new Value.Num(x + y, integral);
            case "-" -> new Value.Num(x - y, integral);
            case "*" -> new Value.Num(x * y, integral);
            case "/" -> y == 0 ? new Value.Unknown("division by zero") : new Value.Num(x / y, false);
            case "//" -> y == 0 ? new Value.Unknown("division by zero") : new Value.Num(Math.floor(x / y), integral);
            case "%" -> y == 0 ? new Value.Unknown("division by zero") : new Value.Num(x - y * Math.floor(x / y), integral);
            default -> new Value.Unknown("result of " + op);
        };
    }

    /** A comparison of known values; {@code __name__ == "__main__"} is the one that matters most. */
    static Value compare(String op, Value a, Value b) {
        if (a instanceof Value.Num x && b instanceof Value.Num y) {
            double l = x.value();
            double r = y.value();
            return switch (op) {
                case "==" -> new Value.Bool(l == r);
                case "!=" -> new Value.Bool(l != r);
                case "<" -> new Value.Bool(l < r);
                case "<=" -> new Value.Bool(l <= r);
                case ">" -> new Value.Bool(l > r);
                case ">=" -> new Value.Bool(l >= r);
                default -> new Value.Unknown("comparison " + op);
            };
        }
        Optional<String> l = Values.constant(a);
        Optional<String> r = Values.constant(b);
        if (l.isPresent() && r.isPresent() && (op.equals("==") || op.equals("!="))) {
            return new Value.Bool(l.get().equals(r.get()) == op.equals("=="));
        }
        return new Value.Unknown("comparison of values not known");
    }
}
