package org.headwater.checks;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

/** GNU make as an outside judge of "older than a prerequisite": {@code make -q} on a generated Makefile. */
final class MakeReference {
    private MakeReference() {
    }

    static boolean available() {
        try {
            Process p = new ProcessBuilder("make", "--version").redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            return p.waitFor(20, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    /** Whether {@code make -q target} says the target needs remaking (exit status 1). */
    static boolean outOfDate(Path workspace, Map<String, List<String>> madeFrom, String target)
            throws IOException, InterruptedException {
        StringBuilder makefile = new StringBuilder();
        madeFrom.forEach((out, ins) -> makefile.append(out).append(": ").append(String.join(" ", ins))
                .append("\n\t@:\n"));
        Path file = Files.createTempFile("freshness", ".mk");
        try {
            Files.writeString(file, makefile);
            Process p = new ProcessBuilder("make", "-q", "-f", file.toString(), target)
                    .directory(workspace.toFile()).redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            if (!p.waitFor(20, TimeUnit.SECONDS)) {
                p.destroyForcibly();
                throw new IllegalStateException("make -q did not finish");
            }
            // GNU make manual, "Summary of Options": -q exits 0 when up to date, 1 when not, 2 on error.
            if (p.exitValue() == 2) {
                throw new IllegalStateException("make -q failed on " + target);
            }
            return p.exitValue() == 1;
        } finally {
            Files.deleteIfExists(file);
        }
    }
}
