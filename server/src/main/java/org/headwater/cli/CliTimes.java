package org.headwater.cli;

import java.time.Instant;
import org.headwater.model.Times;

/** Reads times typed on the command line; a bad one is a usage problem. */
final class CliTimes {
    private CliTimes() {
    }

    static Instant parse(String raw) {
        try {
            return Times.parse(raw);
        } catch (IllegalArgumentException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
    }
}
