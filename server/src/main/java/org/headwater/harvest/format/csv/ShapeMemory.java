package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;
import java.util.List;
import java.util.concurrent.ConcurrentHashMap;

/**
 * What the full sniff of one file found, offered to the files of the same harvest that start
 * with the same first line: the partitions of one table, which a lake holds by the thousand.
 *
 * <p>A file is read with a remembered shape only when the shape fits it as exactly as it fitted
 * the file it was learnt from: the same encoding, no preamble, the same characters among those
 * that make candidate dialects (so the full detector would weigh the same candidates), a parse
 * under the remembered dialect that breaks no quoting rule and gives every record the remembered
 * width, and a first record equal to the remembered header. Any other file is sniffed in full
 * (our rule). Only shapes of the plainest kind are remembered: a header on the first line, at
 * least two columns, data from the second line, not split at spaces.
 *
 * <p>Safe to share between the reading threads of one harvest; bounded so that a tree of
 * ten thousand different tables cannot grow it without end.
 */
public final class ShapeMemory {

  /** A memory that never remembers: every file is sniffed in full, as {@code headwater sniff} does. */
  public static final ShapeMemory NONE = new ShapeMemory(0);

  /** Distinct first lines remembered per harvest (our choice: a few hundred KiB at most). */
  private static final int CAPACITY = 2_048;
  /** A first line longer than this is not remembered (our choice). */
  private static final int MAX_LINE = 4_096;

  /** A remembered shape: the dialect, the marks of its sample, the width and header. */
  record Shape(Dialect dialect, int marks, int width, List<String> headerCells,
      List<String> names) {}

  private final int capacity;
  private final ConcurrentHashMap<String, Shape> shapes = new ConcurrentHashMap<>();
  private final java.util.concurrent.atomic.AtomicLong recalled =
      new java.util.concurrent.atomic.AtomicLong();

  private ShapeMemory(int capacity) {
    this.capacity = capacity;
  }

  /** A memory for the files of one harvest. */
  public static ShapeMemory forOneHarvest() {
    return new ShapeMemory(CAPACITY);
  }

  boolean enabled() {
    return capacity > 0;
  }

  /** The key of a text: its encoding, BOM and first line; null when it has no short first line. */
  static String key(Charset charset, boolean bom, String text) {
    int end = 0;
    int n = Math.min(text.length(), MAX_LINE);
    while (end < n && text.charAt(end) != '\n' && text.charAt(end) != '\r') {
      end++;
    }
    if (end == n) {
      return null;
    }
    return charset.name() + (bom ? "+bom\n" : "\n") + text.substring(0, end);
  }

  Shape recall(String key) {
    return key == null ? null : shapes.get(key);
  }

  void remember(String key, Shape shape) {
    if (key != null && shapes.size() < capacity) {
      shapes.putIfAbsent(key, shape);
    }
  }

  /** Counts a file read with a remembered shape. */
  void fitted() {
    recalled.incrementAndGet();
  }

  /** How many files were read with a remembered shape. */
  long recalled() {
    return recalled.get();
  }

  /** How many shapes are remembered. */
  int size() {
    return shapes.size();
  }

  /** The characters that make candidate dialects, in the order of {@link #marks}' bits. */
  private static final String MARKED = DialectCandidates.DELIMITERS + "\"'\\";

  /** A bit per character of {@link #MARKED} that occurs in {@code text[from, to)}. */
  static int marks(CharSequence text, int from, int to) {
    boolean[] seen = DialectCandidates.seen(text, from, to);
    int marks = 0;
    for (int bit = 0; bit < MARKED.length(); bit++) {
      if (seen[MARKED.charAt(bit)]) {
        marks |= 1 << bit;
      }
    }
    return marks;
  }
}
