package org.headwater.analysis.script.python;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.RunSetting;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.syntax.Grammar;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.syntax.Parsing;
import org.headwater.analysis.script.value.Value;

/**
 * Imports: library modules become names ({@code import pandas as pd} makes {@code pd} stand for
 * {@code pandas}); modules of the workspace ({@code from config import RAW_DIR}) are parsed and their
 * top level run, so their constants are known. A workspace module is looked for beside the script
 * first, as Python puts the script's folder first on sys.path, then at the workspace root.
 * // reference: Python 3 docs, sys.path initialisation
 */
final class LocalModules {
    private final RunSetting run;
    private final Map<Path, PyObjects.Module> loaded = new HashMap<>();
    private final Set<Path> loading = new HashSet<>();

    LocalModules(RunSetting run) {
        this.run = run;
    }

    void importStatement(Node s, Scope scope, PythonEvaluator ev) {
        for (Node name : s.named()) {
            if (name.is("aliased_import")) {
                String dotted = name.field("name").text();
                scope.set(name.field("alias").text(), module(dotted, ev).orElse(new Value.Name(dotted)));
            } else if (name.is("dotted_name")) {
                String top = name.text().split("\\.")[0];
                scope.set(top, module(top, ev).orElse(new Value.Name(top)));
            }
        }
    }

    void importFrom(Node s, Scope scope, PythonEvaluator ev) {
        Node moduleNode = s.field("module_name");
        String module = moduleNode.text().replaceFirst("^\\.+", "");
        boolean relative = moduleNode.text().startsWith(".");
        Optional<Value> local = module.isEmpty() ? Optional.empty() : module(module, ev);
        for (Node child : s.fields("name")) {
            String imported = child.is("aliased_import") ? child.field("name").text() : child.text();
            String alias = child.is("aliased_import") ? child.field("alias").text() : imported;
            Value v;
            if (local.isPresent() && local.get() instanceof Value.Obj o && o.state() instanceof PyObjects.Module m) {
                v = m.scope().lookup(imported).or(() -> module(module + "." + imported, ev))
                        .orElse(new Value.Unknown(imported + " is not set at the top of workspace module " + module));
            } else if (module.isEmpty() || relative) {
                v = module(imported, ev).orElse(new Value.Unknown("relative import of " + imported));
            } else {
                v = new Value.Name(module + "." + imported);
            }
            scope.set(alias, v);
        }
        if (s.named().stream().anyMatch(n -> n.is("wildcard_import"))
                && local.isPresent() && local.get() instanceof Value.Obj o && o.state() instanceof PyObjects.Module m) {
            m.scope().variables().forEach(scope::set);
        }
    }

    /** A workspace module by dotted name, run once per analysis. */
    Optional<Value> module(String dotted, PythonEvaluator ev) {
        Optional<Path> file = locate(dotted);
        if (file.isEmpty()) {
            return Optional.empty();
        }
        Path rel = file.get();
        if (loaded.containsKey(rel)) {
            return Optional.of(new Value.Obj(PyObjects.MODULE, loaded.get(rel)));
        }
        if (!loading.add(rel)) {
            return Optional.of(new Value.Unknown("circular import of " + dotted));
        }
        try {
            String code = Files.readString(run.workspaceRoot().resolve(rel), StandardCharsets.UTF_8);
            // What a module's top level reads belongs to that module's own analysis, not this script's.
            PythonEvaluator inner = new PythonEvaluator(run.forModule(rel), new Findings(), this, dotted);
            inner.block(Parsing.parse(Grammar.PYTHON, code), inner.globals());
            PyObjects.Module m = new PyObjects.Module(dotted, inner.globals());
            loaded.put(rel, m);
            return Optional.of(new Value.Obj(PyObjects.MODULE, m));
        } catch (IOException e) {
            ev.findings().warn("workspace module " + dotted + " could not be read: " + e.getMessage());
            return Optional.empty();
        } finally {
            loading.remove(rel);
        }
    }

    private Optional<Path> locate(String dotted) {
        String relPath = dotted.replace('.', '/');
        List<Path> bases = new ArrayList<>();
        Path scriptDir = run.script().getParent();
        bases.add(scriptDir == null ? Path.of("") : scriptDir);
        bases.add(Path.of(""));
        for (Path base : bases) {
            for (String candidate : List.of(relPath + ".py", relPath + "/__init__.py")) {
                Path rel = base.resolve(candidate).normalize();
                if (!rel.equals(run.script()) && Files.isRegularFile(run.workspaceRoot().resolve(rel))) {
                    return Optional.of(rel);
                }
            }
        }
        return Optional.empty();
    }
}
