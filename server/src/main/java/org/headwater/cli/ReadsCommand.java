package org.headwater.cli;

import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.store.Views.ReferenceView;
import org.headwater.store.Views.ScriptView;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater reads SCRIPT}: what one script reads and writes, resolved and unresolved. */
@Command(name = "reads", mixinStandardHelpOptions = true,
        description = {"Show what a script's code reads and writes: each call with its line, the path or table",
                "it names, and the dataset it was matched to. Unresolved references keep their expression."})
final class ReadsCommand implements Callable<Integer> {
    @Parameters(paramLabel = "SCRIPT", description = "A script path, URI or workspace-relative name.")
    String key;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** The answer: the script and its references. */
    record Result(String script, List<ReferenceView> references) {
    }

    @Override
    public Integer call() {
        Result result;
        try (Catalog open = catalog.open()) {
            List<ScriptView> found = open.reader().findScripts(key);
            if (found.size() != 1) {
                throw new Problems.UsageProblem(found.isEmpty() ? "no script matches '" + key + "'"
                        : "'" + key + "' matches " + found.size() + " scripts; give the full name");
            }
            result = new Result(found.get(0).name(), open.reader().references(found.get(0).id()));
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, result);
            return Main.OK;
        }
        out.println(result.script());
        for (ReferenceView r : result.references()) {
            String where = (r.cell() == null ? "" : "cell " + r.cell() + " ") + "line " + r.line();
            out.printf("  %-5s %-45s %s  (%s, %s)%n", r.direction(), r.resolved() ? r.dataset() : "UNRESOLVED " + r.expression(),
                    r.pattern() == null ? "" : r.pattern(), r.function(), where);
        }
        out.flush();
        return Main.OK;
    }
}
