package org.headwater.bench;

import java.io.IOException;
import java.io.InputStream;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.concurrent.atomic.AtomicLong;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;

/**
 * The harvest benchmark of the file-reading issue: full harvest and no-change re-harvest of the synthetic
 * lake, next to two floors measured in the same run on the same tree (warm page cache): a walk that stats
 * every file, and a walk that stats every file and reads its first 64 KiB. The full harvest as a user's
 * {@code headwater harvest} runs it, in a new process that opens a new catalog, is measured three times, each
 * in a child JVM started with this one's options, and the median is compared with the floor: one such run
 * varied by a fifth from run to run on this machine. Then, in this process: a full harvest, a no-change
 * re-harvest, the peak heap, and a second full harvest into a new empty catalog, which finds the program
 * already compiled. Usage: {@code HarvestBenchmark [lake-dir] [catalog-dir] [tables partitions-per-table]};
 * the lake is generated when absent (default 50 tables of 1,000 partitions).
 */
public final class HarvestBenchmark {
    private HarvestBenchmark() {
    }

    /** Fresh-process harvests whose median is reported (three: a median that one slow run cannot move). */
    private static final int FRESH_RUNS = 3;
    /** The child's argument that makes it one fresh harvest. */
    private static final String FRESH = "--one-fresh-harvest";

    public static void main(String[] args) throws IOException, InterruptedException {
        if (args.length == 3 && args[0].equals(FRESH)) {
            oneFreshHarvest(Path.of(args[1]), Path.of(args[2]));
            return;
        }
        Path lake = Path.of(args.length > 0 ? args[0] : "target/bench-lake");
        Path catalogDir = Path.of(args.length > 1 ? args[1] : "target/bench-catalog");
        if (!Files.isDirectory(lake)) {
            long t = System.nanoTime();
            LakeGenerator generator = args.length > 3
                    ? new LakeGenerator(Integer.parseInt(args[2]), Integer.parseInt(args[3]), 200, 400)
                    : LakeGenerator.standard();
            int n = generator.write(lake);
            System.out.printf("generated %,d files in %.1f s%n", n, (System.nanoTime() - t) / 1e9);
        }
        deleteTree(catalogDir);
        readWalk(lake); // warm the page cache
        double stat = median(() -> statWalk(lake));
        double read = median(() -> readWalk(lake));

        List<FreshRun> fresh = new ArrayList<>();
        Path freshDir = catalogDir.resolveSibling(catalogDir.getFileName() + "-fresh");
        for (int i = 0; i < FRESH_RUNS; i++) {
            deleteTree(freshDir);
            fresh.add(inChildProcess(lake, freshDir));
        }
        deleteTree(freshDir);
        double freshRead = median(() -> readWalk(lake));
        List<FreshRun> byTime = fresh.stream().sorted(Comparator.comparingDouble(FreshRun::seconds)).toList();
        FreshRun middle = byTime.get(byTime.size() / 2);

        resetPeaks();
        long start = System.nanoTime();
        HarvestSummary full;
        HarvestSummary again;
        double fullSeconds;
        double againSeconds;
        try (Catalog catalog = Catalog.open(catalogDir)) {
            full = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            // Until the search index holds it too: the index is written on its own thread.
            catalog.index().absorbedSeq();
            fullSeconds = (System.nanoTime() - start) / 1e9;
            long t = System.nanoTime();
            again = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.index().absorbedSeq();
            againSeconds = (System.nanoTime() - t) / 1e9;
        }
        long peak = peakHeap();
        // The same full harvest once more, into a new empty catalog in the same process: the first one also
        // pays for compiling the program (C2 spent about a third of the run's CPU on it), this one does not.
        Path warmDir = catalogDir.resolveSibling(catalogDir.getFileName() + "-warm");
        deleteTree(warmDir);
        double warmSeconds;
        try (Catalog catalog = Catalog.open(warmDir)) {
            long t = System.nanoTime();
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.index().absorbedSeq();
            warmSeconds = (System.nanoTime() - t) / 1e9;
        }
        deleteTree(warmDir);
        double warmRead = median(() -> readWalk(lake));
        System.out.printf("files %,d: %d datasets, %d scripts, %d errors%n", full.filesSeen(), full.datasets(),
                full.scripts(), full.errors());
        System.out.printf("floor, stat-only walk            %8.2f s%n", stat);
        System.out.printf("floor, walk + first 64 KiB       %8.2f s   (%.2f s measured again after the fresh runs)%n",
                read, freshRead);
        System.out.printf("full harvest, fresh process      %8.2f s   %5.1f x the read floor (target <= 20), median of %d: %s s%n",
                middle.seconds(), middle.seconds() / read, FRESH_RUNS,
                String.join(", ", fresh.stream().map(r -> String.format("%.2f", r.seconds())).toList()));
        System.out.printf("  CPU of that harvest              %8.2f s   (%.2f s of it in the JIT compilers; 2 cores)%n",
                middle.cpuSeconds(), middle.jitSeconds());
        System.out.printf("full harvest, in this process    %8.2f s   %5.1f x the read floor%n", fullSeconds, fullSeconds / read);
        System.out.printf("full harvest, compiled (2nd)     %8.2f s   %5.1f x the read floor measured again (%.2f s)%n",
                warmSeconds, warmSeconds / warmRead, warmRead);
        System.out.printf("no-change re-harvest             %8.2f s   %5.1f x the stat floor (target <= 5), %d changes%n",
                againSeconds, againSeconds / stat, again.changes());
        System.out.printf("peak heap                        %8.0f MiB (target < 1024; fresh processes %.0f MiB at most)%n",
                peak / 1048576.0, fresh.stream().mapToLong(FreshRun::peakHeap).max().orElse(0) / 1048576.0);
    }

    /** One fresh-process harvest: wall and CPU seconds from opening the catalog to the index holding it all. */
    private record FreshRun(double seconds, double cpuSeconds, double jitSeconds, long peakHeap) {
    }

    /**
     * Runs {@link #oneFreshHarvest} in a new JVM: the same java, class path and options as this one, so that
     * the child measures what this benchmark's command line asks for; its last output line holds the figures.
     */
    private static FreshRun inChildProcess(Path lake, Path catalogDir) throws IOException, InterruptedException {
        List<String> command = new ArrayList<>();
        command.add(ProcessHandle.current().info().command().orElse("java"));
        command.addAll(ManagementFactory.getRuntimeMXBean().getInputArguments());
        command.addAll(List.of("-cp", System.getProperty("java.class.path"), HarvestBenchmark.class.getName(),
                FRESH, lake.toString(), catalogDir.toString()));
        Process child = new ProcessBuilder(command).redirectErrorStream(true).start();
        String last = null;
        try (var lines = new java.io.BufferedReader(new java.io.InputStreamReader(child.getInputStream(),
                java.nio.charset.StandardCharsets.UTF_8))) {
            for (String line = lines.readLine(); line != null; line = lines.readLine()) {
                if (line.startsWith(FRESH)) {
                    last = line;
                }
            }
        }
        if (child.waitFor() != 0 || last == null) {
            throw new IOException("The fresh-process harvest failed (exit " + child.exitValue() + ")");
        }
        String[] f = last.substring(FRESH.length()).trim().split(" ");
        return new FreshRun(Double.parseDouble(f[0]), Double.parseDouble(f[1]), Double.parseDouble(f[2]),
                Long.parseLong(f[3]));
    }

    /** The child's part: open a new catalog, harvest the lake, wait for the index, print the figures. */
    private static void oneFreshHarvest(Path lake, Path catalogDir) throws IOException {
        long cpuStart = processCpuNanos();
        long jitStart = ManagementFactory.getCompilationMXBean().getTotalCompilationTime();
        long start = System.nanoTime();
        try (Catalog catalog = Catalog.open(catalogDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.index().absorbedSeq();
            double seconds = (System.nanoTime() - start) / 1e9;
            double cpu = (processCpuNanos() - cpuStart) / 1e9;
            double jit = (ManagementFactory.getCompilationMXBean().getTotalCompilationTime() - jitStart) / 1e3;
            System.out.printf(java.util.Locale.ROOT, "%s %.3f %.3f %.3f %d%n", FRESH, seconds, cpu, jit, peakHeap());
        }
    }

    /** CPU time of the whole process, all threads (the JIT compilers' too). */
    private static long processCpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean()).getProcessCpuTime();
    }

    /** Wall seconds of the middle of three runs. */
    private static double median(IoTask task) throws IOException {
        double[] runs = new double[3];
        for (int i = 0; i < runs.length; i++) {
            long t = System.nanoTime();
            task.run();
            runs[i] = (System.nanoTime() - t) / 1e9;
        }
        Arrays.sort(runs);
        return runs[1];
    }

    @FunctionalInterface
    private interface IoTask {
        void run() throws IOException;
    }

    private static long statWalk(Path root) throws IOException {
        AtomicLong bytes = new AtomicLong();
        Files.walkFileTree(root, new SimpleFileVisitor<>() {
            @Override
            public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) {
                bytes.addAndGet(attrs.size() + attrs.lastModifiedTime().toMillis() % 2);
                return FileVisitResult.CONTINUE;
            }
        });
        return bytes.get();
    }

    private static long readWalk(Path root) throws IOException {
        AtomicLong bytes = new AtomicLong();
        byte[] buffer = new byte[64 * 1024];
        Files.walkFileTree(root, new SimpleFileVisitor<>() {
            @Override
            public FileVisitResult visitFile(Path file, BasicFileAttributes attrs) throws IOException {
                try (InputStream in = Files.newInputStream(file)) {
                    bytes.addAndGet(in.readNBytes(buffer, 0, buffer.length));
                }
                return FileVisitResult.CONTINUE;
            }
        });
        return bytes.get();
    }

    private static void resetPeaks() {
        System.gc();
        ManagementFactory.getMemoryPoolMXBeans().forEach(MemoryPoolMXBean::resetPeakUsage);
    }

    /** Sum of the heap pools' peaks: an upper bound of the heap in use at any one moment. */
    private static long peakHeap() {
        return ManagementFactory.getMemoryPoolMXBeans().stream().filter(p -> p.getType() == MemoryType.HEAP)
                .mapToLong(p -> p.getPeakUsage().getUsed()).sum();
    }

    private static void deleteTree(Path dir) throws IOException {
        if (!Files.exists(dir)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(dir)) {
            paths.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }
}
