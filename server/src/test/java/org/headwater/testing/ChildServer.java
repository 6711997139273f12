package org.headwater.testing;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A {@code headwater} command running in a JVM of its own, on the test class path, with its output in a
 * file. Tests use it to kill a real process ({@link #kill}) and to run a second server on one store.
 */
public final class ChildServer implements AutoCloseable {
    private static final Pattern URL = Pattern.compile("(http://127\\.0\\.0\\.1:\\d+/)");
    private final Process process;
    private final Path output;

    private ChildServer(Process process, Path output) {
        this.process = process;
        this.output = output;
    }

    /** Starts {@code headwater ARGS…}; its standard output and error go to {@code output}. */
    public static ChildServer start(Path output, List<String> env, String... args) throws IOException {
        List<String> command = new ArrayList<>(List.of(
                Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xmx512m", "-XX:TieredStopAtLevel=1", "-Dorg.slf4j.simpleLogger.defaultLogLevel=warn",
                "-cp", System.getProperty("java.class.path"), "org.headwater.cli.Main"));
        command.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(output.toFile());
        for (int i = 0; i + 1 < env.size(); i += 2) {
            pb.environment().put(env.get(i), env.get(i + 1));
        }
        return new ChildServer(pb.start(), output);
    }

    /** Waits for a {@code serve} to print its address, and returns it. */
    public String awaitUrl(Duration timeout) throws IOException, InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (System.nanoTime() < deadline) {
            Matcher m = URL.matcher(Files.readString(output));
            if (m.find()) {
                return m.group(1);
            }
            if (!process.isAlive()) {
                throw new IllegalStateException("The child process ended: " + Files.readString(output));
            }
            Thread.sleep(50);
        }
        throw new IllegalStateException("No address printed within " + timeout + ": " + Files.readString(output));
    }

    public boolean alive() {
        return process.isAlive();
    }

    public String output() throws IOException {
        return Files.readString(output);
    }

    /** Waits for the process to end by itself; returns its exit code, or kills it after the timeout. */
    public int await(Duration timeout) throws InterruptedException {
        if (!process.waitFor(timeout.toMillis(), TimeUnit.MILLISECONDS)) {
            kill();
            throw new IllegalStateException("The child process did not end within " + timeout);
        }
        return process.exitValue();
    }

    /**
     * Ends the process at once, with no shutdown hooks: {@link Process#destroyForcibly()}, which on Linux
     * sends SIGKILL (JDK 17 API docs of Process: "forcibly terminated"; the Linux implementation,
     * ProcessHandleImpl, uses signal 9).
     */
    public void kill() throws InterruptedException {
        process.destroyForcibly();
        process.waitFor(30, TimeUnit.SECONDS);
    }

    @Override
    public void close() throws InterruptedException {
        if (process.isAlive()) {
            kill();
        }
    }
}
