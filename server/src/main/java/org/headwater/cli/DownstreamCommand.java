package org.headwater.cli;

import picocli.CommandLine.Command;

/** {@code headwater downstream TARGET}: everything made from a dataset or column, with the connecting paths. */
@Command(name = "downstream", mixinStandardHelpOptions = true,
        description = {"List what is made from a dataset or column, nearest first, each with the path (script or run,",
                "evidence, confidence per hop) that connects it. --json prints {target, direction, count,",
                "start_in_cycle, results: [{id, name, kind, column, distance, indirect, path: [step]}]}."})
final class DownstreamCommand extends WalkCommand {
    @Override
    boolean upstream() {
        return false;
    }
}
