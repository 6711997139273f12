package org.headwater.cli;

import java.nio.file.NoSuchFileException;
import org.headwater.store.StoreException;

/** Turns failures into one readable line and an exit code, so that users never see a stack trace. */
final class Problems {
    private Problems() {
    }

    static String describe(Exception e) {
        if (e instanceof NoSuchFileException f) {
            return "no such folder: " + f.getFile() + (f.getReason() == null ? "" : " (" + f.getReason() + ")");
        }
        if (e instanceof UsageProblem || e instanceof StoreException) {
            return e.getMessage();
        }
        return e.getClass().getSimpleName() + ": " + e.getMessage();
    }

    static int exitCode(Exception e) {
        return e instanceof UsageProblem || e instanceof NoSuchFileException ? Main.USAGE : Main.PROBLEMS;
    }

    /** The user asked for something that cannot be: a path that is no folder, a name that matches nothing. */
    static final class UsageProblem extends RuntimeException {
        UsageProblem(String message) {
            super(message);
        }
    }
}
