package org.headwater.harvest.format.csv;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.Locale;
import java.util.Random;

/**
 * Measures sniff throughput on 64 KiB heads: a main method, not a test, so that no build
 * depends on the speed of a shared machine. Run (from the repository root):
 *
 * <pre>
 * mvn -B -q -pl server -am test-compile dependency:build-classpath \
 *     -Dmdep.outputFile=target/test.classpath -Dmdep.includeScope=test
 * java -cp server/target/test-classes:server/target/classes:$(cat server/target/test.classpath) \
 *     org.headwater.harvest.format.csv.SniffBenchmark
 * </pre>
 *
 * The data is invented: ids, names with quoted commas, decimals, dates and flags.
 */
public final class SniffBenchmark {

  private static final int HEAD = 64 * 1024;

  private SniffBenchmark() {}

  public static void main(String[] args) throws Exception {
    int seconds = args.length > 0 ? Integer.parseInt(args[0]) : 5;
    String[] labels = {"comma, quoted text", "semicolon, decimal comma", "tab, plain"};
    byte[][] heads = {table(',', '.', true), table(';', ',', false), table('\t', '.', false)};
    // Warm-up by count, not by clock: on a loaded machine two seconds of wall time may hold
    // little CPU time, and the first input would be measured while still being compiled.
    CsvSniffer sniffer = new CsvSniffer();
    for (int i = 0; i < 500; i++) {
      for (byte[] head : heads) {
        sniffer.sniff(head, false, head.length * 100L);
      }
    }
    for (int k = 0; k < heads.length; k++) {
      run(labels[k], heads[k], seconds);
    }
  }

  private static void run(String label, byte[] head, int seconds) throws Exception {
    CsvSniffer sniffer = new CsvSniffer();
    long fileSize = head.length * 100L;
    CsvSniff sniff = sniffer.sniff(head, false, fileSize);
    // CPU time of this thread as well as wall time: on a shared machine the wall clock also
    // counts the time other processes held the cores.
    ThreadMXBean threads = ManagementFactory.getThreadMXBean();
    long runs = 0;
    long start = System.nanoTime();
    long cpuStart = threads.getCurrentThreadCpuTime();
    long end = start + seconds * 1_000_000_000L;
    while (System.nanoTime() < end) {
      sniffer.sniff(head, false, fileSize);
      runs++;
    }
    double elapsed = (System.nanoTime() - start) / 1e9;
    double cpu = (threads.getCurrentThreadCpuTime() - cpuStart) / 1e9;
    double megabytes = runs * (double) head.length / 1e6;
    System.out.printf(Locale.ROOT,
        "%-26s %6.1f MB/s wall  %6.1f MB/s cpu  %6.2f ms/sniff cpu  (%s, %d columns, ~%d rows)%n",
        label, megabytes / elapsed, megabytes / cpu, 1000 * cpu / runs, sniff.dialect(),
        sniff.columns().size(), sniff.rowCount());
  }

  /** About 64 KiB of an invented table, cut mid-row as a real head would be. */
  private static byte[] table(char delimiter, char decimal, boolean quotedCommas) {
    Random random = new Random(42);
    String[] names = {"Anna", "Ben", "Carla", "Dmitri", "Eun-ji", "Farah", "Gustav", "Hana"};
    StringBuilder b = new StringBuilder();
    b.append(String.join(String.valueOf(delimiter),
        "id", "name", "amount", "ratio", "day", "active", "note")).append("\r\n");
    for (int i = 1; b.length() < HEAD + 200; i++) {
      String name = names[random.nextInt(names.length)];
      if (quotedCommas) {
        name = "\"" + name + ", " + (char) ('A' + random.nextInt(26)) + ".\"";
      }
      String amount = String.format(Locale.ROOT, "%.2f", random.nextDouble() * 10_000)
          .replace('.', decimal);
      String ratio = String.format(Locale.ROOT, "%.4f", random.nextDouble()).replace('.', decimal);
      String day = String.format(Locale.ROOT, "2023-%02d-%02d", 1 + random.nextInt(12),
          1 + random.nextInt(28));
      String note = random.nextInt(5) == 0 ? "" : "note " + random.nextInt(1000);
      b.append(i).append(delimiter).append(name).append(delimiter).append(amount)
          .append(delimiter).append(ratio).append(delimiter).append(day).append(delimiter)
          .append(random.nextBoolean()).append(delimiter).append(note).append("\r\n");
    }
    return Arrays.copyOf(b.toString().getBytes(StandardCharsets.UTF_8), HEAD);
  }
}
