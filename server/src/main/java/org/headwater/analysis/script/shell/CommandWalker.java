package org.headwater.analysis.script.shell;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.ScriptInvocation;
import org.headwater.analysis.script.syntax.Node;

/**
 * Walks a parsed shell script in order and collects the command lines that run scripts. Both branches
 * of an {@code if} are walked; a {@code for} over literal words runs its body once per word.
 */
public final class CommandWalker {
    // Commands that run the rest of their words as another command. // common practice, no source
    private static final Set<String> PREFIXES = Set.of("env", "time", "nohup", "exec", "command", "nice");
    private static final int MAX_LOOP_VALUES = 64;

    private final Path driver;
    private final Map<String, String> variables = new HashMap<>();
    private final List<ScriptInvocation> found = new ArrayList<>();
    // Relative to the workspace root; null until a cd shows where the driver runs.
    private Path cwd;

    public CommandWalker(Path driver) {
        this.driver = driver;
    }

    public List<ScriptInvocation> walk(Node program) {
        visit(program);
        return List.copyOf(found);
    }

    private void visit(Node n) {
        switch (n.type()) {
            case "command" -> command(n);
            case "variable_assignment" -> assignment(n);
            case "declaration_command" -> n.named().stream().filter(c -> c.is("variable_assignment")).forEach(this::assignment);
            case "for_statement" -> forLoop(n);
            case "comment" -> {
                // commented-out commands never run
            }
            default -> n.named().forEach(this::visit);
        }
    }

    private void assignment(Node n) {
        Node name = n.field("name");
        Node value = n.field("value");
        if (name != null) {
            String v = value == null ? "" : ShellWords.value(value, variables, driver);
            if (v == null) {
                variables.remove(name.text());
            } else {
                variables.put(name.text(), v);
            }
        }
    }

    private void forLoop(Node n) {
        Node variable = n.field("variable");
        List<Node> values = n.fields("value");
        Node body = n.field("body");
        if (variable == null || body == null) {
            return;
        }
        List<String> words = new ArrayList<>();
        for (Node v : values) {
            List<String> fields = ShellWords.fields(v, variables, driver);
            if (fields.contains(null) || v.is("command_substitution") || words.size() + fields.size() > MAX_LOOP_VALUES) {
                words = null;
                break;
            }
            words.addAll(fields);
        }
        if (words == null || words.isEmpty()) {
            variables.remove(variable.text());
            visit(body);
            return;
        }
        for (String w : words) {
            variables.put(variable.text(), w);
            visit(body);
        }
        variables.remove(variable.text());
    }

    private void command(Node n) {
        List<String> words = new ArrayList<>();
        Node name = n.field("name");
        if (name == null) {
            return;
        }
        words.add(ShellWords.value(name, variables, driver));
        for (Node arg : n.fields("argument")) {
            words.addAll(ShellWords.fields(arg, variables, driver));
        }
        while (!words.isEmpty() && words.get(0) != null && (PREFIXES.contains(words.get(0)) || words.get(0).matches("\\w+=.*"))) {
            words.remove(0);
        }
        if (words.isEmpty() || words.get(0) == null) {
            return;
        }
        if (words.get(0).equals("cd")) {
            changeDirectory(words.size() > 1 ? words.get(1) : null);
            return;
        }
        Optional<Interpreter> interpreter = Interpreter.of(words.get(0));
        interpreter.ifPresent(i -> invocation(i, words, n.line()));
    }

    private void changeDirectory(String target) {
        if (target == null || target.startsWith("/") || target.startsWith("~")) {
            cwd = null; // outside the workspace, or home: the analysis no longer knows
            return;
        }
        // Before any cd the driver is assumed to start at the workspace root.
        Path base = cwd == null ? Path.of("") : cwd;
        cwd = base.resolve(target).normalize();
    }

    private void invocation(Interpreter interpreter, List<String> words, int line) {
        int i = 1;
        for (String lead : interpreter.leading()) {
            if (i < words.size() && lead.equals(words.get(i))) {
                i++;
            } else {
                return;
            }
        }
        while (i < words.size()) {
            String w = words.get(i);
            if (w == null) {
                return; // the script itself is computed at run time
            }
            if (interpreter.runsScript(w)) {
                break;
            }
            if (interpreter.inlineCode().contains(w)) {
                return; // a module or inline code, not a script file
            }
            if (interpreter.optionsWithValue().contains(w)) {
                i++;
            } else if (!w.startsWith("-")) {
                return; // some other sub-command
            }
            i++;
        }
        if (i >= words.size()) {
            return;
        }
        Path base = cwd == null ? Path.of("") : cwd;
        Path script = base.resolve(words.get(i)).normalize();
        List<String> args = new ArrayList<>(words.subList(i + 1, words.size()));
        Path workingDir = interpreter.runsInScriptFolder()
                ? (script.getParent() == null ? Path.of("") : script.getParent())
                : cwd;
        if (interpreter.runsInScriptFolder()) {
            args = List.of(); // nbconvert's own options, not the notebook's
        }
        found.add(new ScriptInvocation(script, args, workingDir, driver, line));
    }
}
