package org.headwater.analysis.script.r;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.lineage.Frame;
import org.headwater.analysis.script.lineage.Origin;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;

/**
 * Runs an R program's expressions in order over abstract values. As for Python: loops run once with
 * the loop variable as a hole, unknown conditions run both branches, {@code if (FALSE)} runs nothing,
 * functions of the script run at their calls and, if never called, once with unknown arguments.
 */
public final class REvaluator {
    static final int MAX_CALL_DEPTH = 8;
    /**
     * Expressions evaluated per analysis: depth alone does not bound functions that call each other several
     * times each (b^depth bodies; mutated scripts found by ScriptFuzzTest ran for minutes). Past it every
     * expression is unknown, so the analysis ends with what it found so far.
     */
    static final int MAX_STEPS = 200_000;
    private int steps;
    static final String FUNCTION = "function";
    static final String SERIES = "r.column";

    /** A function of the script, or of a file it sourced ({@code origin}, relative to the workspace root). */
    record RFunction(Node def, Scope closure, java.nio.file.Path origin) {
    }

    /** A data-frame column, or a value computed from columns. */
    record Column(List<Origin> origins, boolean unknown) {
    }

    private final RunSetting run;
    private final Findings findings;
    private final Scope globals = new Scope(null);
    private final RCalls calls;
    private final Map<String, RFunction> defined = new LinkedHashMap<>();
    private final java.util.Set<String> called = new java.util.HashSet<>();
    private final List<List<Value>> returns = new ArrayList<>();
    // Calls of this script into functions of sourced files, outermost first.
    private final java.util.ArrayDeque<Node> foreignCalls = new java.util.ArrayDeque<>();
    private int depth;

    REvaluator(RunSetting run, Findings findings) {
        this.run = run;
        this.findings = findings;
        this.calls = new RCalls(this, new ReferenceMaker(run, findings, Dialect.R));
    }

    public static REvaluator main(RunSetting run, Findings findings) {
        return new REvaluator(run, findings);
    }

    RunSetting run() {
        return run;
    }

    Findings findings() {
        return findings;
    }

    Scope globals() {
        return globals;
    }

    /** Runs programs (an R file, or the chunks of a document) in one environment. */
    public void run(List<Node> programs) {
        for (Node program : programs) {
            eval(program, globals);
        }
        for (Map.Entry<String, RFunction> e : new ArrayList<>(defined.entrySet())) {
            if (!called.contains(e.getKey())) {
                called.add(e.getKey());
                invoke(e.getValue(), List.of(), Map.of(), true);
            }
        }
    }

    private static String key(Node def) {
        return def.line() + ":" + def.column();
    }

    Value eval(Node e, Scope scope) {
        if (++steps > MAX_STEPS) {
            return new Value.Unknown("analysis stopped after " + MAX_STEPS + " steps");
        }
        if (e == null) {
            return new Value.Nothing();
        }
        return switch (e.type()) {
            case "program", "brace_list" -> {
                Value last = new Value.Nothing();
                for (Node n : e.named()) {
                    last = eval(n, scope);
                }
                yield last;
            }
            case "paren_list" -> e.named().isEmpty() ? new Value.Nothing() : eval(e.named().get(e.named().size() - 1), scope);
            case "left_assignment", "equals_assignment", "right_assignment" -> assign(e, scope, false);
            case "super_assignment", "super_right_assignment" -> assign(e, scope, true);
            case "identifier" -> identifier(e.text(), scope);
            case "string" -> Values.lit(RStrings.literal(e.text()));
            case "float", "integer" -> number(e.text());
            case "true" -> new Value.Bool(true);
            case "false" -> new Value.Bool(false);
            case "null" -> new Value.Nothing();
            case "na", "nan", "inf" -> new Value.Unknown(e.text());
            case "if" -> ifExpression(e, scope);
            case "for" -> {
                Value over = eval(e.field("vector"), scope);
                scope.set(e.field("name").text(), calls.iterate(over));
                eval(e.field("body"), scope);
                yield new Value.Nothing();
            }
            case "while" -> {
                Optional<Boolean> t = Values.truth(eval(e.field("condition"), scope));
                if (t.isEmpty() || t.get()) {
                    eval(e.field("body"), scope);
                }
                yield new Value.Nothing();
            }
            case "repeat" -> {
                eval(e.field("body"), scope);
                yield new Value.Nothing();
            }
            case "function_definition", "lambda_function" -> {
                RFunction fn = new RFunction(e, scope, run.script());
                defined.putIfAbsent(key(e), fn);
                yield new Value.Obj(FUNCTION, fn);
            }
            case "call" -> calls.call(e, scope, null);
            case "pipe" -> calls.call(e.field("right"), scope, e.field("left"));
            case "binary" -> binary(e, scope);
            case "unary" -> unary(e, scope);
            case "namespace_get", "namespace_get_internal" ->
                    new Value.Name(e.field("namespace").text() + "::" + e.field("function").text());
            case "dollar" -> calls.member(eval(e.named().get(0), scope), e.named().size() > 1 ? e.named().get(1).text() : "");
            case "subset2", "subset" -> calls.subset(e, scope);
            case "formula", "comment", "break", "next" -> new Value.Unknown(e.type());
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
            case "T" -> new Value.Bool(true);
            case "F" -> new Value.Bool(false);
            default -> new Value.Name(name); // a function of a package, or a column name under data masking
        };
    }

    private static Value number(String text) {
        String t = text.strip();
        try {
            boolean integer = t.endsWith("L");
            double v = t.startsWith("0x") || t.startsWith("0X") ? Long.parseLong(t.substring(2).replace("L", ""), 16)
                    : Double.parseDouble(integer ? t.substring(0, t.length() - 1) : t);
            return new Value.Num(v, integer || v == Math.rint(v) && !t.contains(".") && !t.contains("e"));
        } catch (NumberFormatException ex) {
            return new Value.Unknown("number " + text);
        }
    }

    private Value assign(Node e, Scope scope, boolean outer) {
        Node target = e.field("name");
        Value v = eval(e.field("value"), scope);
        if (target == null) {
            return v;
        }
        switch (target.type()) {
            case "identifier" -> set(target.text(), v, scope, outer);
            case "string" -> set(RStrings.literal(target.text()), v, scope, outer);
            case "dollar", "subset2" -> calls.assignColumn(target, v, scope);
            default -> {
                // names(x) <- ..., attr(x) <- ...: replacement functions are not followed
            }
        }
        return v;
    }

    private static void set(String name, Value v, Scope scope, boolean outer) {
        if (outer) {
            scope.setOuter(name, v);
        } else {
            scope.set(name, v);
        }
    }

    private Value ifExpression(Node e, Scope scope) {
        Optional<Boolean> truth = Values.truth(eval(e.field("condition"), scope));
        Node yes = e.field("consequence");
        Node no = e.field("alternative");
        if (truth.isPresent()) {
            return truth.get() ? eval(yes, scope) : no == null ? new Value.Nothing() : eval(no, scope);
        }
        Scope a = scope.fork();
        Value va = eval(yes, a);
        if (no == null) {
            scope.join(List.of(a), true);
            return va;
        }
        Scope b = scope.fork();
        Value vb = eval(no, b);
        scope.join(List.of(a, b), false);
        return Values.oneOf(List.of(va, vb));
    }

    private Value binary(Node e, Scope scope) {
        Node opNode = e.field("operator");
        String op = opNode == null ? "" : opNode.text();
        if (op.equals("%>%")) {
            return calls.call(e.field("right"), scope, e.field("left"));
        }
        Value l = eval(e.field("left"), scope);
        Value r = eval(e.field("right"), scope);
        return Values.lift2(l, r, (a, b) -> RCalls.binary(op, a, b));
    }

    private Value unary(Node e, Scope scope) {
        Value v = eval(e.field("operand"), scope);
        String op = e.children().get(0).text();
        if (op.equals("-") && v instanceof Value.Num n) {
            return new Value.Num(-n.value(), n.integral());
        }
        if (op.equals("!")) {
            return Values.truth(v).<Value>map(b -> new Value.Bool(!b)).orElse(new Value.Unknown("!"));
        }
        return v instanceof Value.Num ? v : new Value.Unknown("unary " + op);
    }

    Optional<Node> foreignCallSite() {
        return Optional.ofNullable(foreignCalls.peekFirst());
    }

    /** Calls a function, placing what it reads and writes at {@code site} when the function is a sourced file's. */
    Value invoke(RFunction fn, List<Value> positional, Map<String, Value> named, Node site) {
        boolean foreign = !run.script().equals(fn.origin());
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

    /** Calls a function of the script with its arguments matched to its formals. */
    Value invoke(RFunction fn, List<Value> positional, Map<String, Value> named, boolean unknownArguments) {
        called.add(key(fn.def()));
        if (depth >= MAX_CALL_DEPTH) {
            return new Value.Unknown("calls nested deeper than " + MAX_CALL_DEPTH);
        }
        Scope local = new Scope(fn.closure());
        Node formals = fn.def().named().stream().filter(n -> n.is("formal_parameters")).findFirst().orElse(null);
        Node body = fn.def().named().isEmpty() ? null : fn.def().named().get(fn.def().named().size() - 1);
        int index = 0;
        if (formals != null) {
            for (Node p : formals.named()) {
                String name = p.is("default_parameter") ? p.field("name").text() : p.is("identifier") ? p.text() : null;
                if (name == null) {
                    continue;
                }
                Value v;
                if (named.containsKey(name)) {
                    v = named.get(name);
                } else if (!unknownArguments && index < positional.size()) {
                    v = positional.get(index++);
                } else if (p.is("default_parameter")) {
                    v = eval(p.field("value"), local);
                } else {
                    v = new Value.Unknown("argument " + name + (unknownArguments ? ": no call seen" : ": not given"));
                }
                local.set(name, v);
            }
        }
        depth++;
        returns.add(new ArrayList<>());
        Value last;
        try {
            last = eval(body, local);
        } finally {
            depth--;
        }
        List<Value> all = returns.remove(returns.size() - 1);
        all.add(last); // the value of the last expression is returned too
        return Values.oneOf(all);
    }

    void returned(Value v) {
        if (!returns.isEmpty()) {
            returns.get(returns.size() - 1).add(v);
        }
    }

    static Optional<Frame> frame(Value v) {
        return v instanceof Value.Obj o && o.state() instanceof Frame f ? Optional.of(f) : Optional.empty();
    }

    static Optional<Column> column(Value v) {
        return v instanceof Value.Obj o && o.state() instanceof Column c ? Optional.of(c) : Optional.empty();
    }
}
