package org.headwater.cli;

import java.io.PrintWriter;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.lineage.Target;
import org.headwater.lineage.TargetException;
import org.headwater.lineage.Targets;
import org.headwater.owners.ManualOwners;
import org.headwater.owners.OwnerList;
import org.headwater.store.OwnerReader;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.OwnerView;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater own DATASET [OWNER]}: show whom to ask about a dataset and why, or assign an owner by hand. */
@Command(name = "own", mixinStandardHelpOptions = true,
        description = {"Without OWNER: list a dataset's owners, each with the rule or evidence that says so (owners file",
                "line, assigned by hand, git history of the scripts that write it). With OWNER: make OWNER an owner",
                "(a hand-made owner replaces the owners file's rules for this dataset); --remove ends it."})
final class OwnCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "DATASET", description = "A dataset (path, URI, name), or a partition of a set to see its owners.")
    String key;

    @Parameters(index = "1", arity = "0..1", paramLabel = "OWNER", description = "A person's or a team's name.")
    String owner;

    @Option(names = "--team", description = "OWNER is a team (default: a person).")
    boolean team;

    @Option(names = "--as-of", paramLabel = "TIME",
            description = "List the owners as they were then (2026-03-01 or 2026-03-01T12:00:00Z); not with OWNER.")
    String asOf;

    @Option(names = "--remove", description = "End OWNER's ownership instead.")
    boolean remove;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        List<OwnerView> owners;
        String name;
        try (Catalog open = catalog.open()) {
            OwnerReader reader = new OwnerReader(open.store());
            Target target;
            try {
                target = new Targets(open.reader(), reader, open.lineage()).resolve(key);
            } catch (TargetException e) {
                throw new Problems.UsageProblem(e.getMessage());
            }
            if (target.namesColumn()) {
                throw new Problems.UsageProblem("owners belong to datasets; name " + target.dataset() + " without a column");
            }
            DatasetView dataset = open.reader().dataset(target.datasetId(), null).orElseThrow();
            if (owner != null) {
                if (target.partition() != null) {
                    throw new Problems.UsageProblem(target.partition() + " is a partition of " + target.dataset()
                            + " and has the owners of that set; assign the owner to the set");
                }
                ManualOwners manual = new ManualOwners(open.ingestor(), reader);
                try {
                    if (remove) {
                        manual.remove(dataset.id(), dataset.uri(), dataset.name(), owner, "command line");
                    } else {
                        manual.assign(dataset.id(), dataset.uri(), owner, team ? "team" : "person", "command line");
                    }
                } catch (ManualOwners.Refused | IllegalArgumentException e) {
                    throw new Problems.UsageProblem(e.getMessage());
                }
            } else if (remove || team) {
                throw new Problems.UsageProblem("--remove and --team need an OWNER");
            }
            if (owner != null && asOf != null) {
                throw new Problems.UsageProblem("--as-of only lists owners; it cannot change the past");
            }
            owners = OwnerList.of(reader, target, asOf == null ? null : CliTimes.parse(asOf));
            name = target.partition() != null ? target.partition() : target.dataset();
        }
        PrintWriter out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, new OwnerList(name, owners));
            return Main.OK;
        }
        out.println(name);
        if (owners.isEmpty()) {
            out.println("  no owner known; add a rule to " + org.headwater.owners.OwnersFile.NAME
                    + " or run 'headwater own " + key + " NAME'");
        }
        for (OwnerView o : owners) {
            out.printf("  %s%s%s: %s%n", o.name(), o.kind().equals("team") ? " (team)" : "",
                    o.suggested() ? " (suggested)" : o.inherited() ? " (inherited)" : "", o.reason());
        }
        out.flush();
        return Main.OK;
    }
}
