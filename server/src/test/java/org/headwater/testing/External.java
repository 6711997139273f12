package org.headwater.testing;

import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.Assumptions;

/**
 * Tests that need something outside the project (python3, a database server, a browser) call this. On a
 * developer's machine without it they skip with the reason; under CI, where {@code .ci/run} sets
 * {@code HEADWATER_REQUIRE_EXTERNAL=true}, a missing component is a failure instead.
 */
public final class External {
    private External() {
    }

    public static boolean required() {
        return Boolean.parseBoolean(System.getProperty("headwater.requireExternal", "false"));
    }

    public static void need(boolean available, String what) {
        if (available) {
            return;
        }
        String message = what + " is not available on this machine";
        if (required()) {
            Assertions.fail(message + " (HEADWATER_REQUIRE_EXTERNAL=true turns this skip into a failure)");
        }
        Assumptions.assumeTrue(false, message + "; skipping (install it, or see .ci/run)");
    }
}
