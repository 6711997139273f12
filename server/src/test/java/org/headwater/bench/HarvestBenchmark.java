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
import java.util.Arrays;
import java.util.Comparator;
import java.util.concurrent.atomic.AtomicLong;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;

/**
 * The harvest benchmark of the file-reading issue: full harvest and no-change re-harvest of the synthetic
 * lake, next to two floors measured in the same run on the same tree (warm page cache): a walk that stats
 * every file, and a walk that stats every file and reads its first 64 KiB. Prints wall times, ratios and
 * peak heap; then a second full harvest into a new empty catalog in the same process, which finds the program
 * already compiled. Usage: {@code HarvestBenchmark [lake-dir] [catalog-dir] [tables partitions-per-table]}; the
 * lake is generated when absent (default 50 tables of 1,000 partitions).
 */
public final class HarvestBenchmark {
    private HarvestBenchmark() {
    }

    public static void main(String[] args) throws IOException {
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
        resetPeaks();
        long cpuStart = processCpuNanos();
        long jitStart = ManagementFactory.getCompilationMXBean().getTotalCompilationTime();
        long start = System.nanoTime();
        HarvestSummary full;
        HarvestSummary again;
        double fullSeconds;
        double againSeconds;
        double fullCpu;
        double fullJit;
        try (Catalog catalog = Catalog.open(catalogDir)) {
            full = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            // Until the search index holds it too: the index is written on its own thread.
            catalog.index().absorbedSeq();
            fullSeconds = (System.nanoTime() - start) / 1e9;
            fullCpu = (processCpuNanos() - cpuStart) / 1e9;
            fullJit = (ManagementFactory.getCompilationMXBean().getTotalCompilationTime() - jitStart) / 1e3;
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
        System.out.printf("floor, walk + first 64 KiB       %8.2f s%n", read);
        System.out.printf("full harvest                     %8.2f s   %5.1f x the read floor (target <= 20)%n",
                fullSeconds, fullSeconds / read);
        System.out.printf("  CPU of the full harvest          %8.2f s   (%.2f s of it in the JIT compilers; 2 cores)%n",
                fullCpu, fullJit);
        System.out.printf("full harvest, compiled (2nd)     %8.2f s   %5.1f x the read floor measured again (%.2f s)%n",
                warmSeconds, warmSeconds / warmRead, warmRead);
        System.out.printf("no-change re-harvest             %8.2f s   %5.1f x the stat floor (target <= 5), %d changes%n",
                againSeconds, againSeconds / stat, again.changes());
        System.out.printf("peak heap                        %8.0f MiB (target < 1024)%n", peak / 1048576.0);
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
