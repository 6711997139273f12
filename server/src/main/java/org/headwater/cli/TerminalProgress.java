package org.headwater.cli;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.concurrent.atomic.AtomicLong;
import org.headwater.harvest.FolderHarvester;
import org.headwater.harvest.HarvestProgress;

/**
 * A progress bar on standard error, drawn only on a terminal and only once a harvest has lasted a
 * second, so that short harvests and pipes stay quiet. A background thread counts the files to come, so
 * that the bar has a total; until it knows, the bar shows the count alone.
 */
final class TerminalProgress implements HarvestProgress {
    private static final long DELAY_NANOS = 1_000_000_000L;
    private static final long REDRAW_NANOS = 100_000_000L;
    private static final int WIDTH = 30;

    private final PrintStream err;
    private final long startedAt = System.nanoTime();
    private final AtomicLong total = new AtomicLong(-1);
    private long lastDrawn;
    private boolean drawn;

    private TerminalProgress(PrintStream err, Path root) {
        this.err = err;
        Thread counter = new Thread(() -> total.set(countFiles(root)), "headwater-file-count");
        counter.setDaemon(true);
        counter.start();
    }

    /** A bar when standard error is a terminal, otherwise nothing. */
    static HarvestProgress forTerminal(Path root) {
        return System.console() == null ? HarvestProgress.NONE : new TerminalProgress(System.err, root);
    }

    @Override
    public void filesSeen(int count) {
        long now = System.nanoTime();
        if (now - startedAt < DELAY_NANOS || now - lastDrawn < REDRAW_NANOS) {
            return;
        }
        lastDrawn = now;
        drawn = true;
        err.print("\r" + line(count, total.get(), (now - startedAt) / 1e9));
        err.flush();
    }

    static String line(int count, long total, double seconds) {
        String rate = String.format("%,.0f files/s", count / Math.max(seconds, 1e-3));
        if (total <= 0) {
            return String.format("harvesting  %,d files  %s   ", count, rate);
        }
        double fraction = Math.min(1.0, (double) count / total);
        int filled = (int) Math.round(fraction * WIDTH);
        return String.format("harvesting [%s%s] %3.0f%%  %,d/%,d files  %s   ", "#".repeat(filled),
                " ".repeat(WIDTH - filled), fraction * 100, count, total, rate);
    }

    @Override
    public void finished() {
        if (drawn) {
            err.print("\r" + " ".repeat(100) + "\r");
            err.flush();
        }
    }

    private static long countFiles(Path root) {
        AtomicLong n = new AtomicLong();
        try {
            Files.walkFileTree(root, new SimpleFileVisitor<>() {
                @Override
                public FileVisitResult preVisitDirectory(Path dir, BasicFileAttributes attrs) {
                    boolean hidden = !dir.equals(root) && FolderHarvester.isHidden(dir);
                    return hidden ? FileVisitResult.SKIP_SUBTREE : FileVisitResult.CONTINUE;
                }

                @Override
                public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) {
                    if (attrs.isRegularFile() && !FolderHarvester.isHidden(file)) {
                        n.incrementAndGet();
                    }
                    return FileVisitResult.CONTINUE;
                }

                @Override
                public FileVisitResult visitFileFailed(Path file, IOException e) {
                    return FileVisitResult.CONTINUE;
                }
            });
        } catch (IOException e) {
            return -1;
        }
        return n.get();
    }
}
