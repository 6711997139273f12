package org.headwater.analysis.script;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/** Runs outside reference tools (python3, bash) and finds the repository's demo workspace. */
final class External {
    private External() {
    }

    static boolean required() {
        return Boolean.parseBoolean(System.getProperty("headwater.requireExternal", "false"));
    }

    /** Skips the test with a reason, or fails it when outside components are required. */
    static void need(boolean present, String what) {
        if (!present && required()) {
            throw new AssertionError(what + " is required (headwater.requireExternal=true) but absent");
        }
        Assumptions.assumeTrue(present, what + " is absent: skipping this reference check");
    }

    static boolean onPath(String command) {
        try {
            Process p = new ProcessBuilder(command, "--version").redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            return p.waitFor(30, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException | InterruptedException e) {
            return false;
        }
    }

    /** Runs a command and gives its standard output; fails on a non-zero exit. */
    static String run(Path dir, List<String> command, java.util.Map<String, String> env) throws IOException, InterruptedException {
        ProcessBuilder pb = new ProcessBuilder(command).directory(dir.toFile());
        pb.environment().putAll(env);
        Path err = Files.createTempFile("headwater-ref", ".err");
        pb.redirectError(err.toFile());
        Process p = pb.start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        if (!p.waitFor(120, TimeUnit.SECONDS) || p.exitValue() != 0) {
            throw new AssertionError(command + " failed: " + Files.readString(err));
        }
        Files.deleteIfExists(err);
        return out;
    }

    /** The demo workspace of the repository, when this checkout has it. */
    static Path demoWorkspace() {
        String repo = System.getProperty("headwater.repoRoot");
        Path base = repo == null || repo.isBlank() ? Path.of("..") : Path.of(repo);
        Path demo = base.resolve("examples/quillwater-lab");
        if (!Files.isDirectory(demo) && Files.isDirectory(Path.of("examples/quillwater-lab"))) {
            demo = Path.of("examples/quillwater-lab");
        }
        return demo.toAbsolutePath().normalize();
    }
}
