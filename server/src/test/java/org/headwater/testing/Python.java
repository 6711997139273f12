package org.headwater.testing;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/** Runs python3 for reference computations; tests call {@link #requireAvailable()} first. */
public final class Python {
    private Python() {
    }

    public static void requireAvailable() {
        External.need(available(), "python3");
    }

    static boolean available() {
        try {
            Process p = new ProcessBuilder("python3", "--version").redirectErrorStream(true).start();
            return p.waitFor(20, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    /** Runs a script with arguments and returns its standard output; a non-zero exit fails the test. */
    public static String run(Path script, String... args) throws IOException, InterruptedException {
        List<String> command = new ArrayList<>(List.of("python3", script.toString()));
        command.addAll(List.of(args));
        Process p = new ProcessBuilder(command).redirectError(ProcessBuilder.Redirect.INHERIT).start();
        byte[] out = p.getInputStream().readAllBytes();
        if (!p.waitFor(120, TimeUnit.SECONDS) || p.exitValue() != 0) {
            throw new AssertionError("python3 " + script + " failed with exit code " + p.exitValue());
        }
        return new String(out, StandardCharsets.UTF_8);
    }
}
