package org.headwater.testing;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.headwater.cli.Main;

/** Runs a {@code headwater} command line in the test's JVM and keeps what it printed. */
public final class Cli {
    private Cli() {
    }

    /** What one command printed and returned. */
    public record Ran(int exit, String out, String err) {
    }

    public static Ran run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int exit = Main.run(new PrintWriter(out, true), new PrintWriter(err, true), args);
        return new Ran(exit, out.toString(), err.toString());
    }
}
