package org.headwater.cli;

import picocli.CommandLine.Command;

/** {@code headwater upstream TARGET}: everything a dataset or column is made from, with the connecting paths. */
@Command(name = "upstream", mixinStandardHelpOptions = true,
        description = {"List what a dataset or column is made from, nearest first, each with the path (script or run,",
                "evidence, confidence per hop) that connects it. --json prints {target, direction, count,",
                "start_in_cycle, results: [{id, name, kind, column, distance, indirect, path: [step]}]}."})
final class UpstreamCommand extends WalkCommand {
    @Override
    boolean upstream() {
        return true;
    }
}
