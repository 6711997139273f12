package org.headwater.analysis.script.python;

import java.util.ArrayList;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Obj;
import org.headwater.analysis.script.value.Values;

/**
 * Runs a Python module's statements in order over abstract values. Loops run their body once with the
 * loop variable as a hole; an if whose condition is not known runs both branches and joins their
 * variables as choices; a constant-false condition ({@code if False:}, {@code if 0:}) runs nothing.
 */
public final class PythonEvaluator {
    static final int MAX_CALL_DEPTH = 8;
    /**
     * Expressions evaluated per analysis: depth alone does not bound functions that call each other several
     * times each (b^depth bodies; mutated scripts found by ScriptFuzzTest ran for minutes). Past it every
     * expression is unknown, so the analysis ends with what it found so far.
     */
    static final int MAX_STEPS = 200_000;
    private int steps;

    private final RunSetting run;
    private final Findings findings;
    private final LocalModules modules;
    private final String moduleName;
    private final Scope globals = new Scope(null);
    private final PythonCalls calls;
    // Functions defined but never called are run at the end with unknown arguments, so nothing is dropped.
    private final Map<Node, Scope> defined = new LinkedHashMap<>();
    private final Set<String> called = new java.util.HashSet<>();
    private final List<List<Value>> returnStack = new ArrayList<>();
    // Calls of this script into functions of other workspace files, outermost first.
    private final java.util.ArrayDeque<Node> foreignCalls = new java.util.ArrayDeque<>();
    private int depth;

    PythonEvaluator(RunSetting run, Findings findings, LocalModules modules, String moduleName) {
        this.run = run;
        this.findings = findings;
        this.modules = modules;
        this.moduleName = moduleName;
        this.calls = new PythonCalls(this, new ReferenceMaker(run, findings, Dialect.PYTHON));
    }

    /** An evaluator for a script or notebook run as the main module. */
    public static PythonEvaluator main(RunSetting run, Findings findings) {
        return new PythonEvaluator(run, findings, new LocalModules(run), "__main__");
    }

    RunSetting run() {
        return run;
    }

    Findings findings() {
        return findings;
    }

    LocalModules modules() {
        return modules;
    }

    Scope globals() {
        return globals;
    }

    /** Runs module bodies (one per notebook cell) in one namespace, then the functions nobody called. */
    public void run(List<Node> modulesInOrder) {
        for (Node module : modulesInOrder) {
            block(module, globals);
        }
        finish();
    }

    private void finish() {
        // Running an uncalled function can define more (nested functions): a few rounds reach them.
        for (int round = 0; round < 4; round++) {
            List<Map.Entry<Node, Scope>> pending = new ArrayList<>(defined.entrySet());
            boolean ran = false;
            for (Map.Entry<Node, Scope> e : pending) {
                if (!called.contains(key(e.getKey()))) {
                    called.add(key(e.getKey()));
                    ran = true;
                    if (e.getKey().is("lambda")) {
                        invokeLambda(new PyObjects.Lambda(e.getKey(), e.getValue()), List.of());
                    } else {
                        invoke(new PyObjects.Function(e.getKey(), e.getValue(), moduleName), List.of(), Map.of(), true);
                    }
                }
            }
            if (!ran) {
                return;
            }
        }
    }

    private static String key(Node def) {
        return def.line() + ":" + def.column() + ":" + def.cell();
    }

    // ---- statements

    void block(Node block, Scope scope) {
        for (Node stmt : block.named()) {
            statement(stmt, scope);
        }
    }

    private void statement(Node s, Scope scope) {
        switch (s.type()) {
            case "expression_statement" -> s.named().forEach(e -> expressionStatement(e, scope));
            case "if_statement" -> ifStatement(s, scope);
            case "for_statement" -> forStatement(s, scope);
            case "while_statement" -> {
                Optional<Boolean> truth = Values.truth(eval(s.field("condition"), scope));
                if (truth.isEmpty() || truth.get()) {
                    block(s.field("body"), scope);
                }
            }
            case "with_statement" -> withStatement(s, scope);
            case "try_statement" -> s.named().forEach(part -> {
                if (part.is("block")) {
                    block(part, scope);
                } else {
                    part.named().stream().filter(n -> n.is("block")).forEach(b -> block(b, scope));
                }
            });
            case "function_definition" -> define(s, scope);
            case "decorated_definition" -> {
                s.named().stream().filter(n -> n.is("decorator")).forEach(d -> d.named().forEach(x -> eval(x, scope)));
                statement(s.field("definition"), scope);
            }
            case "class_definition" -> classDefinition(s, scope);
            case "import_statement" -> modules.importStatement(s, scope, this);
            case "import_from_statement" -> modules.importFrom(s, scope, this);
            case "global_statement", "nonlocal_statement" -> s.named().forEach(n -> scope.declareGlobal(n.text()));
            case "return_statement" -> {
                Value v = s.named().isEmpty() ? new Value.Nothing() : eval(s.firstNamed(), scope);
                if (!returnStack.isEmpty()) {
                    returnStack.get(returnStack.size() - 1).add(v);
                }
            }
            case "match_statement" -> {
                s.fields("subject").forEach(n -> eval(n, scope));
                s.named().stream().filter(n -> n.is("block")).forEach(body ->
                        body.named().forEach(c -> c.named().stream().filter(n -> n.is("block")).forEach(b -> block(b, scope))));
            }
            case "pass_statement", "break_statement", "continue_statement", "future_import_statement",
                    "delete_statement", "type_alias_statement" -> {
                // nothing to follow
            }
            case "block", "module" -> block(s, scope);
            default -> s.named().forEach(n -> eval(n, scope));
        }
    }

    private void expressionStatement(Node e, Scope scope) {
        switch (e.type()) {
            case "assignment" -> assignment(e, scope);
            case "augmented_assignment" -> {
                Node left = e.field("left");
                String op = e.children().get(1).text();
                Value v = calls.binary(op.substring(0, op.length() - 1), eval(left, scope), eval(e.field("right"), scope));
                bind(left, v, scope);
            }
            default -> eval(e, scope);
        }
    }

    private void assignment(Node a, Scope scope) {
        Node right = a.field("right");
        if (right == null) {
            return; // an annotation without a value
        }
        Value v = right.is("assignment") ? assignedValue(right, scope) : eval(right, scope);
        bind(a.field("left"), v, scope);
    }

    private Value assignedValue(Node chained, Scope scope) {
        assignment(chained, scope);
        Node right = chained.field("right");
        return right.is("assignment") ? assignedValue(right, scope) : eval(chained.field("left"), scope);
    }

    /** Binds an assignment or loop target: names, tuples, frame columns. */
    void bind(Node target, Value v, Scope scope) {
        switch (target.type()) {
            case "identifier" -> scope.set(target.text(), v);
            case "pattern_list", "tuple_pattern", "list_pattern", "tuple", "list", "expression_list" -> {
                List<Node> parts = target.named();
                for (int i = 0; i < parts.size(); i++) {
                    bind(parts.get(i), item(v, i), scope);
                }
            }
            case "subscript" -> calls.assignColumn(target, v, scope);
            case "as_pattern_target", "parenthesized_expression" -> {
                if (target.firstNamed() != null) {
                    bind(target.firstNamed(), v, scope);
                }
            }
            default -> {
                // attributes of objects are not followed
            }
        }
    }

    /** The i-th item of a value being unpacked; a loop item unpacks into loop items of each position. */
    static Value item(Value v, int i) {
        if (v instanceof Value.Items items) {
            return i < items.items().size() ? items.items().get(i) : new Value.Unknown("too few values to unpack");
        }
        if (v instanceof Value.Each each && each.values() != null) {
            List<Value> column = new ArrayList<>();
            for (Value row : each.values()) {
                column.add(item(row, i));
            }
            return new Value.Each(column, "*");
        }
        if (v instanceof Value.OneOf) {
            return Values.lift1(v, x -> item(x, i));
        }
        return new Value.Unknown("unpacked from " + Values.describe(v));
    }

    private void ifStatement(Node s, Scope scope) {
        List<Node[]> clauses = new ArrayList<>();
        clauses.add(new Node[] {s.field("condition"), s.field("consequence")});
        Node elseBody = null;
        for (Node alt : s.fields("alternative")) {
            if (alt.is("elif_clause")) {
                clauses.add(new Node[] {alt.field("condition"), alt.field("consequence")});
            } else if (alt.is("else_clause")) {
                elseBody = alt.field("body");
            }
        }
        List<Scope> branches = new ArrayList<>();
        for (Node[] clause : clauses) {
            Optional<Boolean> truth = Values.truth(eval(clause[0], scope));
            if (truth.isPresent() && !truth.get()) {
                continue; // unreachable: if False, if 0, elif on a false constant
            }
            if (truth.isPresent() && branches.isEmpty()) {
                block(clause[1], scope); // always taken: no join needed
                return;
            }
            Scope branch = scope.fork();
            block(clause[1], branch);
            branches.add(branch);
            if (truth.isPresent()) {
                scope.join(branches, false);
                return;
            }
        }
        if (elseBody != null) {
            if (branches.isEmpty()) {
                block(elseBody, scope);
                return;
            }
            Scope branch = scope.fork();
            block(elseBody, branch);
            branches.add(branch);
            scope.join(branches, false);
        } else if (!branches.isEmpty()) {
            scope.join(branches, true);
        }
    }

    private void forStatement(Node s, Scope scope) {
        Value iterable = eval(s.field("right"), scope);
        bind(s.field("left"), calls.iterate(iterable), scope);
        block(s.field("body"), scope);
        Node alternative = s.field("alternative");
        if (alternative != null && alternative.field("body") != null) {
            block(alternative.field("body"), scope);
        }
    }

    private void withStatement(Node s, Scope scope) {
        for (Node clause : s.named()) {
            if (!clause.is("with_clause")) {
                continue;
            }
            for (Node item : clause.named()) {
                Node value = item.field("value");
                if (value == null) {
                    continue;
                }
                if (value.is("as_pattern")) {
                    Value v = eval(value.firstNamed(), scope);
                    Node alias = value.field("alias");
                    if (alias != null) {
                        bind(alias, v, scope);
                    }
                } else {
                    eval(value, scope);
                }
            }
        }
        block(s.field("body"), scope);
    }

    private void define(Node def, Scope scope) {
        scope.set(def.field("name").text(), new Obj(PyObjects.FUNCTION, new PyObjects.Function(def, scope, moduleName)));
        defined.put(def, scope);
    }

    private void classDefinition(Node def, Scope scope) {
        scope.set(def.field("name").text(), new Obj(PyObjects.CLASS, def.field("name").text()));
        Scope body = new Scope(scope);
        for (Node stmt : def.field("body").named()) {
            Node d = stmt.is("decorated_definition") ? stmt.field("definition") : stmt;
            if (d.is("function_definition")) {
                defined.put(d, scope); // methods: run once with unknown arguments
            } else {
                statement(stmt, body);
            }
        }
    }

    /** The call in this script that led into another workspace file's function, if the evaluation is inside one. */
    Optional<Node> foreignCallSite() {
        return Optional.ofNullable(foreignCalls.peekFirst());
    }

    /** Calls a function, placing what it reads and writes at {@code site} when the function is another file's. */
    Value invoke(PyObjects.Function fn, List<Value> positional, Map<String, Value> named, Node site) {
        boolean foreign = !moduleName.equals(fn.module());
        if (foreign) {
            foreignCalls.addLast(site);
        }
        try {
            return invoke(fn, positional, named, false);
        } finally {
            if (foreign) {
                foreignCalls.removeLast();
            }
        }
    }

    /** Calls a function of the script: binds its parameters and runs its body; the value is the choice of its returns. */
    Value invoke(PyObjects.Function fn, List<Value> positional, Map<String, Value> named, boolean unknownArguments) {
        called.add(key(fn.def()));
        if (depth >= MAX_CALL_DEPTH) {
            return new Value.Unknown("calls nested deeper than " + MAX_CALL_DEPTH);
        }
        Scope local = new Scope(fn.closure());
        String name = fn.def().field("name").text();
        int index = 0;
        for (Node p : fn.def().field("parameters").named()) {
            String param = parameterName(p);
            if (param == null) {
                continue;
            }
            Value v;
            if (p.is("list_splat_pattern") || p.is("dictionary_splat_pattern")) {
                v = new Value.Unknown("*args of " + name);
            } else if (named.containsKey(param)) {
                v = named.get(param);
            } else if (!unknownArguments && index < positional.size()) {
                v = positional.get(index);
            } else if (p.is("default_parameter") || p.is("typed_default_parameter")) {
                Value def = eval(p.field("value"), fn.closure());
                v = unknownArguments ? Values.oneOf(List.of(def, new Value.Unknown("argument " + param + " of " + name + ": no call seen"))) : def;
            } else {
                v = new Value.Unknown("parameter " + param + " of " + name + (unknownArguments ? ": no call seen" : ": not given"));
            }
            index++;
            local.set(param, v);
        }
        depth++;
        returnStack.add(new ArrayList<>());
        try {
            block(fn.def().field("body"), local);
        } finally {
            depth--;
        }
        List<Value> returns = returnStack.remove(returnStack.size() - 1);
        return returns.isEmpty() ? new Value.Nothing() : Values.oneOf(returns);
    }

    private static String parameterName(Node p) {
        return switch (p.type()) {
            case "identifier" -> p.text();
            case "default_parameter", "typed_default_parameter" -> p.field("name").text();
            case "typed_parameter", "list_splat_pattern", "dictionary_splat_pattern" -> p.firstNamed() == null ? null
                    : p.firstNamed().is("identifier") ? p.firstNamed().text() : parameterName(p.firstNamed());
            default -> null;
        };
    }

    /** Runs a lambda's body with its parameters bound. */
    Value invokeLambda(PyObjects.Lambda fn, List<Value> args) {
        called.add(key(fn.node()));
        Scope local = new Scope(fn.closure());
        Node params = fn.node().field("parameters");
        if (params != null) {
            List<Node> names = params.named();
            for (int i = 0; i < names.size(); i++) {
                String n = parameterName(names.get(i));
                if (n != null) {
                    local.set(n, i < args.size() ? args.get(i) : new Value.Unknown("lambda parameter " + n));
                }
            }
        }
        return eval(fn.node().field("body"), local);
    }

    // ---- expressions

    Value eval(Node e, Scope scope) {
        if (++steps > MAX_STEPS) {
            return new Value.Unknown("analysis stopped after " + MAX_STEPS + " steps");
        }
        if (e == null) {
            return new Value.Unknown("missing expression");
        }
        return switch (e.type()) {
            case "identifier" -> identifier(e.text(), scope);
            case "string", "concatenated_string" -> PyStrings.of(e, n -> eval(n, scope));
            case "integer" -> integer(e.text());
            case "float" -> floating(e.text());
            case "true" -> new Value.Bool(true);
            case "false" -> new Value.Bool(false);
            case "none" -> new Value.Nothing();
            case "list", "tuple", "set", "expression_list" -> items(e, scope);
            case "dictionary" -> dictionary(e, scope);
            case "parenthesized_expression" -> e.firstNamed() == null ? new Value.Items(List.of()) : eval(e.firstNamed(), scope);
            case "binary_operator" -> calls.binary(e.children().get(1).text(), eval(e.field("left"), scope), eval(e.field("right"), scope));
            case "comparison_operator" -> comparison(e, scope);
            case "boolean_operator" -> booleanOperator(e, scope);
            case "not_operator" -> Values.truth(eval(e.field("argument"), scope)).<Value>map(b -> new Value.Bool(!b))
                    .orElse(new Value.Unknown("not of an unknown value"));
            case "unary_operator" -> unary(e, scope);
            case "conditional_expression" -> conditional(e, scope);
            case "attribute" -> calls.attribute(eval(e.field("object"), scope), e.field("attribute").text(), e);
            case "subscript" -> calls.subscript(e, scope);
            case "call" -> calls.call(e, scope);
            case "lambda" -> {
                defined.putIfAbsent(e, scope);
                yield new Obj(PyObjects.LAMBDA, new PyObjects.Lambda(e, scope));
            }
            case "list_comprehension", "generator_expression", "set_comprehension", "dictionary_comprehension" -> comprehension(e, scope);
            case "named_expression" -> {
                Value v = eval(e.field("value"), scope);
                scope.set(e.field("name").text(), v);
                yield v;
            }
            case "await", "yield" -> e.firstNamed() == null ? new Value.Unknown(e.type()) : eval(e.firstNamed(), scope);
            case "keyword_argument" -> eval(e.field("value"), scope);
            default -> {
                e.named().forEach(n -> eval(n, scope));
                yield new Value.Unknown(e.type() + " not followed");
            }
        };
    }

    private Value identifier(String name, Scope scope) {
        Optional<Value> v = scope.lookup(name);
        if (v.isPresent()) {
            return v.get();
        }
        return switch (name) {
            case "__file__" -> Values.lit(run.scriptFile().toString());
            case "__name__" -> Values.lit(moduleName);
            // unbound names are builtins (open, range, str...), or names the analysis lost track of
            default -> new Value.Name("builtins." + name);
        };
    }

    private static Value integer(String text) {
        try {
            String t = text.replace("_", "").toLowerCase(java.util.Locale.ROOT);
            long v = t.startsWith("0x") ? Long.parseLong(t.substring(2), 16) : t.startsWith("0o") ? Long.parseLong(t.substring(2), 8)
                    : t.startsWith("0b") ? Long.parseLong(t.substring(2), 2) : Long.parseLong(t);
            return new Value.Num(v, true);
        } catch (NumberFormatException ex) {
            return new Value.Unknown("integer " + text);
        }
    }

    private static Value floating(String text) {
        try {
            return new Value.Num(Double.parseDouble(text.replace("_", "")), false);
        } catch (NumberFormatException ex) {
            return new Value.Unknown("number " + text);
        }
    }

    private Value items(Node e, Scope scope) {
        List<Value> out = new ArrayList<>();
        for (Node n : e.named()) {
            if (n.is("list_splat")) {
                Value inner = eval(n.firstNamed(), scope);
                if (inner instanceof Value.Items it) {
                    out.addAll(it.items());
                } else {
                    return new Value.Unknown("unpacked list");
                }
            } else {
                out.add(eval(n, scope));
            }
        }
        return new Value.Items(out);
    }

    private Value dictionary(Node e, Scope scope) {
        Map<String, Value> out = new LinkedHashMap<>();
        for (Node pair : e.named()) {
            if (!pair.is("pair")) {
                continue;
            }
            Optional<String> key = Values.constant(eval(pair.field("key"), scope));
            Value value = eval(pair.field("value"), scope);
            key.ifPresent(k -> out.put(k, value));
        }
        return new Value.Dict(out);
    }

    private Value comparison(Node e, Scope scope) {
        List<Node> operands = e.named();
        List<String> ops = new ArrayList<>();
        for (Node c : e.children()) {
            if (!c.isNamed()) {
                ops.add(c.text());
            }
        }
        if (operands.size() != 2 || ops.size() != 1) {
            operands.forEach(o -> eval(o, scope));
            return new Value.Unknown("chained comparison");
        }
        Value l = eval(operands.get(0), scope);
        Value r = eval(operands.get(1), scope);
        return Values.lift2(l, r, (a, b) -> PythonCalls.compare(ops.get(0), a, b));
    }

    private Value booleanOperator(Node e, Scope scope) {
        Value left = eval(e.field("left"), scope);
        String op = e.children().get(1).text();
        Optional<Boolean> truth = Values.truth(left);
        if (truth.isPresent()) {
            boolean takeLeft = op.equals("and") ? !truth.get() : truth.get();
            return takeLeft ? left : eval(e.field("right"), scope);
        }
        return Values.oneOf(List.of(left, eval(e.field("right"), scope)));
    }

    private Value unary(Node e, Scope scope) {
        Value v = eval(e.field("argument"), scope);
        String op = e.children().get(0).text();
        if (v instanceof Value.Num n && op.equals("-")) {
            return new Value.Num(-n.value(), n.integral());
        }
        return op.equals("+") ? v : new Value.Unknown("unary " + op);
    }

    private Value conditional(Node e, Scope scope) {
        List<Node> parts = e.named();
        Optional<Boolean> truth = Values.truth(eval(parts.get(1), scope));
        if (truth.isPresent()) {
            return eval(truth.get() ? parts.get(0) : parts.get(2), scope);
        }
        return Values.oneOf(List.of(eval(parts.get(0), scope), eval(parts.get(2), scope)));
    }

    private Value comprehension(Node e, Scope scope) {
        Scope inner = new Scope(scope);
        Node body = e.field("body");
        for (Node clause : e.named()) {
            if (clause.is("for_in_clause")) {
                bind(clause.field("left"), calls.iterate(eval(clause.field("right"), inner)), inner);
            }
        }
        if (body != null && body.is("pair")) {
            eval(body.field("key"), inner);
            eval(body.field("value"), inner);
            return new Value.Unknown("dictionary comprehension");
        }
        Value one = eval(body, inner);
        return new Value.Each(List.of(one), "*");
    }

    /** The origins a series value carries, for column assignment. */
    static Optional<PyObjects.Series> series(Value v) {
        return v instanceof Obj o && o.state() instanceof PyObjects.Series s ? Optional.of(s) : Optional.empty();
    }

    static Optional<Frame> frame(Value v) {
        return v instanceof Obj o && o.state() instanceof Frame f ? Optional.of(f) : Optional.empty();
    }

    static Value seriesOf(List<Origin> origins, boolean unknown) {
        return new Obj(PyObjects.SERIES, new PyObjects.Series(List.copyOf(origins), unknown));
    }

    static boolean isMutableReceiverName(Node n) {
        return n != null && n.is("identifier");
    }

    static IdentityHashMap<Object, Object> identity() {
        return new IdentityHashMap<>();
    }
}
