package org.headwater.cli;

import java.time.Clock;
import java.util.concurrent.Callable;
import org.headwater.access.Audit;
import org.headwater.model.Times;
import org.headwater.store.Store;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater audit}: the audit log of the catalog in --data-dir, newest first. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = "Show the audit log: edits, refused requests, token creation, use and revocation.")
final class AuditCommand implements Callable<Integer> {
    @Option(names = "--since", paramLabel = "TIME", description = "Only entries from this time (2026-03-01 or an ISO instant).")
    String since;

    @Option(names = "--action", paramLabel = "ACTION", description = "Only one action: edit, refused, token.create, token.use, token.revoke, run.io_refused.")
    String action;

    @Option(names = "--limit", paramLabel = "N", defaultValue = "100", description = "At most N entries (default ${DEFAULT-VALUE}).")
    int limit;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        java.time.Instant from;
        try {
            from = since == null ? null : Times.parse(since);
        } catch (IllegalArgumentException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
        try (Store store = TokenCommand.open(catalog)) {
            var events = new Audit(store, Clock.systemUTC()).list(from, action, Math.max(1, limit));
            var out = spec.commandLine().getOut();
            if (output.json) {
                Output.printJson(out, events);
                return Main.OK;
            }
            for (Audit.Event e : events) {
                out.printf("%s  %-14s %-20s %s%s%s%n", e.at(), e.action(), e.actor(), e.target() == null ? "" : e.target(),
                        e.status() == null ? "" : " -> " + e.status(), e.detail() == null ? "" : "  (" + e.detail() + ")");
            }
            out.flush();
        }
        return Main.OK;
    }
}
