package org.headwater.cli;

import java.util.concurrent.Callable;
import org.headwater.Catalog;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

/** {@code headwater reindex}: rebuilds the search index from the store. */
@Command(name = "reindex", mixinStandardHelpOptions = true,
        description = "Rebuild the search index from the catalog database (the database is the source of truth).")
final class ReindexCommand implements Callable<Integer> {
    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** What a rebuild did. */
    record Result(int documents, long changeSeq, long elapsedMillis) {
    }

    @Override
    public Integer call() {
        long started = System.nanoTime();
        Result result;
        try (Catalog open = catalog.open()) {
            open.index().rebuild();
            result = new Result(open.index().documentCount(), open.index().absorbedSeq(),
                    (System.nanoTime() - started) / 1_000_000);
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, result);
        } else {
            out.printf("Search index rebuilt: %d documents, up to change %d, in %d ms%n", result.documents(),
                    result.changeSeq(), result.elapsedMillis());
            out.flush();
        }
        return Main.OK;
    }
}
