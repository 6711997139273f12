package org.headwater.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.checks.Check;
import org.headwater.checks.FreshnessChecks;
import org.headwater.checks.Report;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

/** {@code headwater check}: evaluates every dataset's freshness, records what changed, fails on late or stale. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Check the freshness of every dataset: against its policy (maximum age or expected schedule)"
                + " and against its inputs (an output older than one of its inputs is stale).",
                "States: fresh, due, late, stale, unknown. Exit code 1 when any dataset is late or stale."})
final class CheckCommand implements Callable<Integer> {
    @picocli.CommandLine.Option(names = "--as-of", paramLabel = "TIME",
            description = "Show the states the checks had recorded by then (2026-03-01 or 2026-03-01T12:00:00Z); records nothing.")
    String asOf;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Report report;
        try (Catalog open = catalog.open()) {
            FreshnessChecks checks = open.freshness();
            report = asOf == null ? checks.record().report() : checks.recordedAsOf(CliTimes.parse(asOf));
        }
        PrintWriter out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, report);
        } else {
            print(out, report);
        }
        return report.failed() ? Main.PROBLEMS : Main.OK;
    }

    private static void print(PrintWriter out, Report report) {
        int width = report.checks().stream().mapToInt(c -> c.name().length()).max().orElse(4);
        width = Math.min(width, 60);
        for (Check c : report.checks()) {
            out.printf("%-7s  %-" + width + "s  since %s  %s%n", c.state(), c.name(), c.since().truncatedTo(java.time.temporal.ChronoUnit.SECONDS), c.why());
        }
        StringBuilder counts = new StringBuilder();
        report.counts().forEach((state, n) -> counts.append(counts.length() == 0 ? "" : ", ").append(n).append(' ').append(state));
        out.println(counts);
        out.flush();
    }
}
