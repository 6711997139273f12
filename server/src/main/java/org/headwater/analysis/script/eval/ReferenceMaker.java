package org.headwater.analysis.script.eval;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.Direction;
import org.headwater.analysis.script.io.IoKind;
import org.headwater.analysis.script.io.IoRule;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Dialect;
import org.headwater.analysis.script.value.Rendered;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;
import org.headwater.model.DatasetKind;

/** Turns the value of a matched call's path argument into data references, one per possible path. */
public final class ReferenceMaker {
    /** A command-line argument no driver supplies: dropped when the code has a default beside it. */
    public static final String NO_ARGUMENT = "no command-line argument given";
    /**
     * A read or write inside a function of another workspace file, placed at this script's call: the
     * path is this call's, but the function's body is not this script's to show.
     */
    public static final double OTHER_FILE = 0.9;
    // The token scan of SQL text is a heuristic (see SqlTables).
    private static final double SQL_SCAN = 0.8;

    private final RunSetting run;
    private final Findings findings;
    private final Dialect dialect;

    public ReferenceMaker(RunSetting run, Findings findings, Dialect dialect) {
        this.run = run;
        this.findings = findings;
        this.dialect = dialect;
    }

    /**
     * Records the references a call makes.
     *
     * @param value the path argument's value
     * @param expression the path argument's code, or the call's when the path is the receiver
     * @param call where the call starts: the reference's line and column, as Python's ast reports calls
     * @param factor what the evaluator's own certainty multiplies the rule's confidence by
     */
    public List<DataReference> make(IoRule rule, Direction direction, Value value, Node expression, Node call,
            String function, double factor) {
        List<Value> options = value instanceof Value.OneOf oneOf ? oneOf.options() : List.of(value);
        boolean someKnown = options.stream().anyMatch(o -> !(o instanceof Value.Unknown));
        List<DataReference> out = new ArrayList<>();
        for (Value option : options) {
            if (option instanceof Value.Unknown u && u.why().startsWith(NO_ARGUMENT) && someKnown) {
                findings.warn("line " + call.line() + ": " + u.why() + "; the default beside it is used");
                continue;
            }
            double confidence = rule.confidence() * factor * (options.size() > 1 ? 0.9 : 1.0);
            out.addAll(forOption(rule, direction, option, expression, call, function, confidence));
        }
        findings.add(out);
        return out;
    }

    private List<DataReference> forOption(IoRule rule, Direction direction, Value option, Node expr, Node call,
            String function, double confidence) {
        if (option instanceof Value.Items items) {
            List<DataReference> out = new ArrayList<>();
            for (Value item : items.items()) {
                out.addAll(forOption(rule, direction, item, expr, call, function, confidence));
            }
            return out;
        }
        if (rule.kind() == IoKind.TABLE || rule.kind() == IoKind.QUERY) {
            return tables(rule, direction, option, expr, call, function, confidence);
        }
        Value.Text text = option instanceof Value.PathValue p ? p.text() : option instanceof Value.Text t ? t
                : option instanceof Value.Each each ? Values.asText(each, dialect) : null;
        if (text == null) {
            if (option instanceof Value.Unknown u) {
                findings.warn("line " + call.line() + ": path of " + function + " not resolved: " + u.why());
                return List.of(unresolved(rule, direction, null, false, expr, call, function, confidence));
            }
            // A buffer, a connection or a handle: not a path, and the open() that made a handle reported it.
            return List.of();
        }
        Rendered r = Rendered.of(text);
        String pattern = WorkspacePaths.resolve(r.pattern(), run);
        List<String> instances = r.instances().stream().map(i -> WorkspacePaths.resolve(i, run)).toList();
        if (!r.complete()) {
            findings.warn("line " + call.line() + ": path of " + function + " only partly known: " + expr.text());
            return List.of(unresolved(rule, direction, pattern, r.glob(), expr, call, function, confidence));
        }
        DatasetKind kind = rule.kind() == IoKind.FIGURE ? DatasetKind.FIGURE : r.glob() ? DatasetKind.FILE_SET : DatasetKind.FILE;
        return List.of(new DataReference(direction, pattern, r.glob(), instances, null, kind, function, expr.text(),
                call.line(), call.column(), call.cell(), clamp(confidence), true));
    }

    private List<DataReference> tables(IoRule rule, Direction direction, Value option, Node expr, Node call,
            String function, double confidence) {
        Optional<String> name = Values.constant(option);
        if (name.isEmpty()) {
            return List.of(new DataReference(direction, null, false, List.of(), null, DatasetKind.TABLE, function,
                    expr.text(), call.line(), call.column(), call.cell(), clamp(confidence), false));
        }
        if (rule.kind() == IoKind.TABLE || SqlTables.isBareName(name.get())) {
            return List.of(table(direction, name.get().strip(), expr, call, function, confidence));
        }
        List<String> tables = SqlTables.tablesRead(name.get());
        if (tables.isEmpty()) {
            findings.warn("line " + call.line() + ": no table found in the SQL of " + function);
        }
        return tables.stream().map(t -> table(direction, t, expr, call, function, confidence * SQL_SCAN)).toList();
    }

    private static DataReference table(Direction d, String name, Node expr, Node call, String function, double c) {
        return new DataReference(d, null, false, List.of(), name, DatasetKind.TABLE, function, expr.text(),
                call.line(), call.column(), call.cell(), clamp(c), true);
    }

    private static DataReference unresolved(IoRule rule, Direction d, String pattern, boolean glob, Node expr, Node call,
            String function, double c) {
        DatasetKind kind = rule.kind() == IoKind.FIGURE ? DatasetKind.FIGURE : DatasetKind.FILE;
        return new DataReference(d, pattern, glob, List.of(), null, kind, function, expr.text(), call.line(),
                call.column(), call.cell(), clamp(c), false);
    }

    private static double clamp(double c) {
        return Math.max(0.0, Math.min(1.0, Math.round(c * 1000) / 1000.0));
    }
}
