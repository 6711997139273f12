package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;
import java.util.List;

/** Counts data rows exactly in a whole file, or estimates them from a head. */
final class RowCounter {

  private RowCounter() {}

  /** A whole-file record count and the footer records at its end. */
  record Tally(long records, int footer) {}

  /**
   * Counts the records of a whole file from the first data row, without building cells, and
   * finds the footer among the last records. In an ASCII-compatible charset the bytes are
   * scanned directly (every character the splitter acts on is one ASCII byte); other
   * charsets are decoded first.
   *
   * @param text the decoded head, which starts the file
   * @param dataStart offset of the first data row in {@code text}
   */
  static Tally countWholeFile(byte[] bytes, int bom, Charset charset, String text, int dataStart,
      CsvParser parser, int width) {
    CharSequence full;
    int start;
    if (TextDecoder.asciiCompatible(charset)) {
      full = new ByteCharView(bytes, bom, bytes.length);
      start = text.substring(0, dataStart).getBytes(charset).length;
    } else {
      full = TextDecoder.decode(bytes, bom, bytes.length, charset, true);
      start = dataStart;
    }
    CsvParser.RecordCount count = parser.count(full, start, LayoutDetector.MAX_FOOTER);
    if (count.lastStarts().length == 0) {
      return new Tally(0, 0);
    }
    // The tail is read as text so that the words of a footer can be recognised.
    int tailStart = count.lastStarts()[0];
    CharSequence tailText = full instanceof ByteCharView
        ? TextDecoder.decode(bytes, bom + tailStart, bytes.length, charset, true)
        : full.subSequence(tailStart, full.length());
    List<CsvRecord> tail = parser.parse(tailText, 0, LayoutDetector.MAX_FOOTER, true).records();
    return new Tally(count.records(), LayoutDetector.footerRecords(tail, width, -1));
  }

  /**
   * The rows of the head scaled by the bytes they take to the size of the file.
   *
   * @param decodedBytes bytes (after the byte order mark) that {@code text} was decoded from
   * @param fileSize the file's size in bytes, negative when unknown
   */
  static long estimate(List<CsvRecord> rows, String text, int dataStart, int decodedBytes,
      int bom, long fileSize, List<String> warnings) {
    if (rows.isEmpty()) {
      warnings.add("row count unknown: no complete data row in the sample");
      return 0;
    }
    if (fileSize < 0) {
      warnings.add("row count is the sample's: file size unknown");
      return rows.size();
    }
    double bytesPerChar = text.isEmpty() ? 1.0 : decodedBytes / (double) text.length();
    int dataEnd = rows.get(rows.size() - 1).end();
    double dataBytes = (dataEnd - dataStart) * bytesPerChar;
    double before = bom + dataStart * bytesPerChar;
    if (dataBytes <= 0) {
      return rows.size();
    }
    return Math.max(rows.size(), Math.round(rows.size() * (fileSize - before) / dataBytes));
  }
}
