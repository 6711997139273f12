package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;
import java.util.ArrayList;
import java.util.List;

/**
 * Detects everything {@link CsvSniff} holds from the head (or all) of a delimited text file.
 * Safe to share between threads: it keeps no state between calls.
 */
public final class CsvSniffer {

  /** How many metadata lines may stand between a preamble and the header (our choice). */
  private static final int METADATA_RETRIES = 3;

  private final SniffLimits limits;
  private final EncodingDetector encodingDetector = new EncodingDetector();

  public CsvSniffer() {
    this(SniffLimits.DEFAULT);
  }

  public CsvSniffer(SniffLimits limits) {
    this.limits = limits;
  }

  /**
   * Sniffs a file.
   *
   * @param head the first bytes of the file, or all of them
   * @param wholeFile whether {@code head} is the complete file (then the row count is exact)
   * @param fileSize the file's size in bytes, used to estimate the row count from a partial
   *     head; negative when unknown
   * @throws NotDelimitedTextException when the bytes are empty, binary or not a table; also,
   *     rather than any unchecked exception, when the detector itself fails
   */
  public CsvSniff sniff(byte[] head, boolean wholeFile, long fileSize)
      throws NotDelimitedTextException {
    if (head == null) {
      throw new NotDelimitedTextException(NotDelimitedTextException.Reason.EMPTY, "no bytes");
    }
    try {
      return new Run(head, wholeFile || fileSize >= 0 && fileSize == head.length, fileSize).sniff();
    } catch (RuntimeException | StackOverflowError e) {
      throw new NotDelimitedTextException(NotDelimitedTextException.Reason.UNEXPECTED,
          "detector failure: " + e, e);
    }
  }

  /** The state of one sniff. */
  private final class Run {
    private final byte[] head;
    private final boolean complete;
    private final long fileSize;
    private final List<String> warnings = new ArrayList<>();

    Run(byte[] head, boolean complete, long fileSize) {
      this.head = head;
      this.complete = complete;
      this.fileSize = fileSize;
    }

    CsvSniff sniff() throws NotDelimitedTextException {
      DetectedEncoding encoding = encodingDetector.detect(head, complete);
      if (encoding.basis() == DetectedEncoding.Basis.STATISTICAL
          || encoding.basis() == DetectedEncoding.Basis.FALLBACK) {
        warnings.add("encoding " + encoding.charset().name().toLowerCase(java.util.Locale.ROOT)
            + " is a guess (" + encoding.basis().name().toLowerCase(java.util.Locale.ROOT) + ")");
      }
      Charset charset = encoding.charset();
      int bom = encoding.bomLength();
      int decodeEnd = (int) Math.min(head.length, (long) bom + limits.profileBytes());
      boolean decodedAll = complete && decodeEnd == head.length;
      String text = TextDecoder.decode(head, bom, decodeEnd, charset, decodedAll);
      rejectBinary(text);

      LeadingLines leading = LayoutDetector.leading(text);
      int sampleEnd = (int) Math.min(text.length(), (long) leading.offset() + limits.scoringChars());
      String sample = text.substring(leading.offset(), sampleEnd);
      if (sample.isBlank()) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.EMPTY,
            "no table: only blank or comment lines");
      }
      boolean sampleAtEnd = decodedAll && sampleEnd == text.length();
      DialectScore best = DialectDetector.detect(sample, sampleAtEnd, limits.scoringRows(),
          leading.forcedDelimiter());
      Dialect dialect = best.dialect();
      List<CsvRecord> scored = best.parsed().records();
      if (scored.isEmpty()) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.NOT_TABULAR,
            "no complete record in the sample");
      }
      int width = LayoutDetector.modalWidth(scored);
      if (scored.size() >= 5 && width > 1 && LayoutDetector.shareOfWidth(scored, width) < 0.5) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.NOT_TABULAR,
            "no steady row width: " + width + " cells in only "
                + Math.round(100 * LayoutDetector.shareOfWidth(scored, width)) + "% of rows");
      }
      if (width == 1) {
        warnings.add("one column: no delimiter found");
      }

      int first = LayoutDetector.preambleRecords(scored, width);
      NumberFormat numbers = NumberFormatDetector.detect(
          scored.subList(Math.min(first + 1, scored.size()), scored.size()), dialect.delimiter());
      boolean header = false;
      for (int retry = 0; retry <= METADATA_RETRIES && first < scored.size(); retry++) {
        RowRole role = HeaderDetector.classify(scored.get(first),
            scored.subList(first + 1, scored.size()), width, numbers.convention());
        if (role == RowRole.METADATA && retry < METADATA_RETRIES) {
          first++;
          continue;
        }
        header = role == RowRole.HEADER;
        break;
      }
      int tableStart = first < scored.size()
          ? leading.offset() + scored.get(first).start() : text.length();
      int skipLines = LayoutDetector.physicalLines(text, tableStart);
      List<String> names;
      int dataStart;
      if (header) {
        CsvRecord headerRecord = scored.get(first);
        names = ColumnNames.fromHeader(headerRecord.cells(), width);
        dataStart = leading.offset() + headerRecord.end();
        if (headerRecord.width() > width) {
          warnings.add("header has " + headerRecord.width() + " names for " + width + " columns");
        }
      } else {
        names = ColumnNames.generated(width);
        dataStart = tableStart;
      }

      CsvParser parser = new CsvParser(dialect);
      ParsedRecords data = parser.parse(text, dataStart, limits.profileRows(), decodedAll);
      List<CsvRecord> rows = data.records();
      boolean reachedEnd = decodedAll && rows.size() < limits.profileRows();
      int footer = 0;
      long rowCount;
      boolean exact = complete;
      if (reachedEnd) {
        footer = LayoutDetector.footerRecords(rows, width, -1);
        rowCount = rows.size() - footer;
      } else if (complete) {
        CountedTail tail = countWholeFile(text, dataStart, charset, bom, parser, width);
        footer = tail.footer();
        rowCount = tail.records() - footer;
      } else {
        rowCount = estimate(rows, text, dataStart, decodeEnd - bom, bom);
      }
      List<CsvRecord> profiled = reachedEnd ? rows.subList(0, rows.size() - footer) : rows;
      warnRagged(profiled, width);
      if (best.parsed().irregularities() > 0) {
        warnings.add(best.parsed().irregularities() + " field(s) break the quoting rules of "
            + "RFC 4180 and were read leniently");
      }
      TerminatorCounts terminators = best.parsed().terminators();
      if (terminators.mixed()) {
        warnings.add("mixed line terminators: " + terminators);
      }
      List<ColumnProfile> columns = ColumnProfiler.profile(names, profiled, numbers.convention(),
          warnings);
      return new CsvSniff(charset, encoding.bom(), dialect, terminators.dominant(), header,
          skipLines, footer, numbers.convention().decimal(), numbers.thousandsSeparator(),
          columns, rowCount, exact, profiled.size(), warnings);
    }

    private void rejectBinary(String text) throws NotDelimitedTextException {
      int controls = 0;
      for (int i = 0, n = text.length(); i < n; i++) {
        char c = text.charAt(i);
        if (c < 0x20 && c != '\t' && c != '\n' && c != '\r' && c != '\f' || c == 0x7F) {
          controls++;
        }
      }
      if (controls > 0 && controls * 100L > text.length()) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.BINARY,
            "control characters in " + controls + " of " + text.length() + " characters");
      }
    }

    /** Counts the records of a whole file too long to profile entirely, and its footer. */
    private CountedTail countWholeFile(String text, int dataStart, Charset charset, int bom,
        CsvParser parser, int width) {
      CharSequence full;
      int start;
      if (TextDecoder.asciiCompatible(charset)) {
        full = new ByteCharView(head, bom, head.length);
        start = text.substring(0, dataStart).getBytes(charset).length;
      } else {
        full = TextDecoder.decode(head, bom, head.length, charset, true);
        start = dataStart;
      }
      CsvParser.RecordCount count = parser.count(full, start, LayoutDetector.MAX_FOOTER);
      int footer = 0;
      if (count.lastStarts().length > 0) {
        // The tail is re-read as text so that a footer's words can be recognised.
        int tailStart = count.lastStarts()[0];
        CharSequence tailText = full instanceof ByteCharView
            ? TextDecoder.decode(head, bom + tailStart, head.length, charset, true)
            : full.subSequence(tailStart, full.length());
        List<CsvRecord> tail = parser.parse(tailText, 0, LayoutDetector.MAX_FOOTER, true).records();
        footer = LayoutDetector.footerRecords(tail, width, -1);
      }
      return new CountedTail(count.records(), footer);
    }

    /** Rows in the head, scaled by the bytes they take to the size of the file. */
    private long estimate(List<CsvRecord> rows, String text, int dataStart, int decodedBytes,
        int bom) {
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

    private void warnRagged(List<CsvRecord> rows, int width) {
      long ragged = rows.stream().filter(r -> r.width() != width).count();
      if (ragged > 0) {
        warnings.add(ragged + " data row(s) do not have " + width + " cells");
      }
    }
  }

  /** A whole-file record count and the footer records at its end. */
  private record CountedTail(long records, int footer) {}
}
