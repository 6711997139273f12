package org.headwater.harvest.format.csv;

import java.nio.charset.Charset;
import java.util.ArrayList;
import java.util.List;

/**
 * Detects everything {@link CsvSniff} holds from the head (or all) of a delimited text file.
 * Safe to share between threads: it keeps no state between calls.
 */
public final class CsvSniffer {

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
    return sniff(head, wholeFile, fileSize, ShapeMemory.NONE);
  }

  /**
   * Sniffs a file, reading it with a shape learnt from an earlier file of {@code memory} when that
   * shape fits it (see {@link ShapeMemory}), and teaching the memory this file's shape otherwise.
   */
  public CsvSniff sniff(byte[] head, boolean wholeFile, long fileSize, ShapeMemory memory)
      throws NotDelimitedTextException {
    return sniff(head, wholeFile, fileSize, memory, ColumnStats.ALL);
  }

  /**
   * As above, working out only the column statistics {@code stats} names: a harvest that keeps no
   * cell values, or only a partition's columns, need not compute the rest.
   */
  public CsvSniff sniff(byte[] head, boolean wholeFile, long fileSize, ShapeMemory memory,
      ColumnStats stats) throws NotDelimitedTextException {
    if (head == null) {
      throw new NotDelimitedTextException(NotDelimitedTextException.Reason.EMPTY, "no bytes");
    }
    try {
      return new Run(head, wholeFile || fileSize >= 0 && fileSize == head.length, fileSize, memory,
          stats).sniff();
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
    private final ShapeMemory memory;
    private final ColumnStats stats;
    private final List<String> warnings = new ArrayList<>();

    Run(byte[] head, boolean complete, long fileSize, ShapeMemory memory, ColumnStats stats) {
      this.head = head;
      this.complete = complete;
      this.fileSize = fileSize;
      this.memory = memory;
      this.stats = stats;
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
      int sampleEnd =
          (int) Math.min(text.length(), (long) leading.offset() + limits.scoringChars());
      if (isBlank(text, leading.offset(), sampleEnd)) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.EMPTY,
            "no table: only blank or comment lines");
      }
      boolean sampleAtEnd = decodedAll && sampleEnd == text.length();
      String shapeKey = leading.offset() == 0 && leading.forcedDelimiter() == 0
          && memory.enabled() ? ShapeMemory.key(charset, encoding.bom(), text) : null;
      ShapeMemory.Shape known = memory.recall(shapeKey);
      DialectScore recalled = known == null ? null : refit(known, text, sampleEnd, sampleAtEnd);
      DialectScore best = recalled != null ? recalled : detect(text, leading, sampleEnd, sampleAtEnd);
      Dialect dialect = best.dialect();
      List<CsvRecord> scored = best.parsed().records();
      if (scored.isEmpty()) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.NOT_TABULAR,
            "no complete record in the sample");
      }
      int width = steadyWidth(scored);

      NumberFormat numbers = NumberFormatDetector.detect(
          scored.subList(Math.min(1, scored.size()), scored.size()), dialect.delimiter());
      int warned = warnings.size();
      // A remembered header stands for this file's first line too; a units row under it does not
      // come with the memory (its sibling had none), so such a file is located in full.
      boolean unitsRow = recalled != null && scored.size() > 2 && HeaderDetector.isUnitsRow(
          scored.get(1), scored.subList(2, scored.size()), width, numbers.convention());
      TableLayout layout = recalled != null && !unitsRow
          ? new TableLayout(width, true, 0, scored.get(0).end(), known.names())
          : TableLocator.locate(text, scored, width, numbers.convention(), warnings);
      if (recalled == null && shapeKey != null && plain(best, layout, width, warned)) {
        memory.remember(shapeKey, new ShapeMemory.Shape(dialect, ShapeMemory.marks(text, 0,
            sampleEnd), width, scored.get(0).cells(), layout.names()));
      }

      // When the scored sample is all the decoded text, its records are the data rows too.
      boolean scoredAll = sampleEnd == text.length() && scored.size() < limits.scoringRows()
          && scored.size() < limits.profileRows();
      List<CsvRecord> parsedRows = scoredAll ? recordsFrom(scored, layout.dataStart()) : null;
      DataRows data = dataRows(new CsvParser(dialect), text, layout, encoding,
          decodedAll, decodeEnd - bom, parsedRows);
      warnRagged(data.profiled(), width);
      if (best.parsed().irregularities() > 0) {
        warnings.add(best.parsed().irregularities() + " field(s) break the quoting rules of "
            + "RFC 4180 and were read leniently");
      }
      TerminatorCounts terminators = best.parsed().terminators();
      if (terminators.mixed()) {
        warnings.add("mixed line terminators: " + terminators);
      }
      List<String> names = layout.names();
      if (trailingDelimiter(scored, width)) {
        // "a,b,c," on every line, the header's included: the empty last cell is a habit of
        // the writer, not a column (our rule).
        warnings.add("every line ends with the delimiter: the empty last column is left out");
        names = names.subList(0, width - 1);
      }
      List<ColumnProfile> columns = ColumnProfiler.profile(names, data.profiled(),
          numbers.convention(), warnings, stats);
      return new CsvSniff(charset, encoding.bom(), dialect, terminators.dominant(),
          layout.header(), layout.skipLines(), data.footer(), numbers.convention().decimal(),
          numbers.thousandsSeparator(), columns, data.rowCount(), complete,
          data.profiled().size(), warnings);
    }

    /** The full detection: every candidate dialect scored, then the one-column readings weighed. */
    private DialectScore detect(String text, LeadingLines leading, int sampleEnd,
        boolean sampleAtEnd) {
      DialectScore best = DialectDetector.detect(text, leading.offset(), sampleEnd, sampleAtEnd,
          limits.scoringRows(), leading.forcedDelimiter());
      if (!best.parsed().records().isEmpty() && (LayoutDetector.modalWidth(best.parsed().records()) == 1
          || !steady(best.parsed().records()) || wordsAtSpaces(best))) {
        // One column of values (that may hold spaces): no candidate splits it steadily, a
        // delimiter that splits only some lines is none, and spaces that split only words
        // (few numbers or dates, no quoted cell) are the spaces inside labels (our rules).
        DialectScore single = oneColumn(text, leading.offset(), sampleEnd, sampleAtEnd);
        if (single != null) {
          best = single;
        }
      }
      return best;
    }

    /**
     * The sample parsed under a remembered shape, or null when the shape does not fit it as
     * exactly as {@link ShapeMemory} asks: same marks, no broken quoting rule, every record of the
     * remembered width, the remembered header first.
     */
    private DialectScore refit(ShapeMemory.Shape shape, String text, int sampleEnd,
        boolean sampleAtEnd) {
      if (ShapeMemory.marks(text, 0, sampleEnd) != shape.marks()) {
        return null;
      }
      ParsedRecords parsed = new CsvParser(shape.dialect()).parse(text, 0, sampleEnd,
          limits.scoringRows(), sampleAtEnd);
      List<CsvRecord> records = parsed.records();
      if (parsed.irregularities() != 0 || records.size() < 2
          || !records.get(0).cells().equals(shape.headerCells())
          || LayoutDetector.shareOfWidth(records, shape.width()) != 1.0) {
        return null;
      }
      memory.fitted();
      return new DialectScore(shape.dialect(), Double.NaN, Double.NaN, Double.NaN, parsed);
    }

    /**
     * Whether a fully sniffed shape is of the plain kind {@link ShapeMemory} keeps: two columns
     * or more, not split at spaces, no broken quoting rule, every scored record of the table's
     * width, the header on the first line and data from the next, and nothing the locator had to
     * warn about.
     */
    private boolean plain(DialectScore best, TableLayout layout, int width, int warned) {
      List<CsvRecord> records = best.parsed().records();
      return width >= 2 && best.dialect().delimiter() != ' ' && best.parsed().irregularities() == 0
          && records.size() >= 2 && layout.header() && layout.skipLines() == 0
          && layout.dataStart() == records.get(0).end() && warnings.size() == warned
          && LayoutDetector.shareOfWidth(records, width) == 1.0;
    }

    /**
     * The sample read as one column: under the first of , ; tab | that never occurs in it,
     * with the double quote; null when every one occurs, when quotes are unbalanced, or when
     * a line is too long to be a value (prose).
     */
    private DialectScore oneColumn(String text, int from, int to, boolean atEnd) {
      for (char delimiter : new char[] {',', ';', '\t', '|'}) {
        if (text.indexOf(delimiter, from) < 0 || text.indexOf(delimiter, from) >= to) {
          DialectScore score = DialectScorer.score(text, from, to, atEnd, limits.scoringRows(),
              new Dialect(delimiter, '"', Escape.DOUBLE), 0.0);
          boolean clean = score.parsed() != null && score.parsed().irregularities() == 0
              && !score.parsed().records().isEmpty()
              && score.parsed().records().stream().allMatch(r -> r.width() == 1
                  && shortValue(r.cells().get(0)));
          return clean ? score : null;
        }
      }
      return null;
    }

    /**
     * A value of a one-column table, not a line of prose: at most 48 characters and four
     * spaces (our thresholds: names, codes, numbers and dates fit; sentences do not).
     */
    private static boolean shortValue(String cell) {
      return cell.length() <= 48 && cell.chars().filter(c -> c == ' ').count() <= 4;
    }

    /** Whether every record of the table's width (two at least) has an empty last cell. */
    private static boolean trailingDelimiter(List<CsvRecord> records, int width) {
      if (width < 2) {
        return false;
      }
      int full = 0;
      for (CsvRecord record : records) {
        if (record.width() == width) {
          if (!Cells.trim(record.cells().get(width - 1)).isEmpty()) {
            return false;
          }
          full++;
        }
      }
      return full >= 2;
    }

    /** A space "delimiter" with few typed cells (under a fifth; our threshold) and no quoted cell. */
    private static boolean wordsAtSpaces(DialectScore score) {
      return score.dialect().delimiter() == ' ' && score.type() < 0.2
          && score.parsed().quotedFields() == 0;
    }

    /** Whether the records have the steady width {@link #steadyWidth} asks for. */
    private boolean steady(List<CsvRecord> records) {
      int width = LayoutDetector.modalWidth(records);
      int first = 0;
      while (records.get(first).width() != width) {
        first++;
      }
      return !(records.size() >= 5 && width > 1
          && LayoutDetector.shareOfWidth(records, width) < 0.5
          && LayoutDetector.shareOfWidth(records.subList(first, records.size()), width) < 0.8);
    }

    /** The modal record width, refusing text whose records have no steady width. */
    private int steadyWidth(List<CsvRecord> records) throws NotDelimitedTextException {
      int width = LayoutDetector.modalWidth(records);
      // Prose split at spaces or commas has no steady width: refused when under half the
      // records have the modal width, unless the records from the first one of that width on
      // (the table after a long preamble) mostly have it (thresholds: our choice).
      int first = 0;
      while (records.get(first).width() != width) {
        first++;
      }
      double share = LayoutDetector.shareOfWidth(records, width);
      double tableShare =
          LayoutDetector.shareOfWidth(records.subList(first, records.size()), width);
      if (records.size() >= 5 && width > 1 && share < 0.5 && tableShare < 0.8) {
        throw new NotDelimitedTextException(NotDelimitedTextException.Reason.NOT_TABULAR,
            "no steady row width: " + width + " cells in only " + Math.round(100 * share)
                + "% of rows");
      }
      if (width == 1) {
        warnings.add("one column: no delimiter found");
      }
      return width;
    }

    /**
     * Parses the data rows to profile and counts all of them: from the rows themselves when
     * the text holds the whole file, by a cell-free scan of the bytes when the whole file is
     * longer than the profile limit, by estimate from a head.
     */
    private DataRows dataRows(CsvParser parser, String text, TableLayout layout,
        DetectedEncoding encoding, boolean decodedAll, int decodedBytes,
        List<CsvRecord> parsedRows) {
      List<CsvRecord> rows = parsedRows != null ? parsedRows
          : parser.parse(text, layout.dataStart(), limits.profileRows(), decodedAll).records();
      if (decodedAll && rows.size() < limits.profileRows()) {
        int footer = LayoutDetector.footerRecords(rows, layout.width(), -1);
        List<CsvRecord> profiled = rows.subList(0, rows.size() - footer);
        return new DataRows(profiled, profiled.size(), footer);
      }
      if (complete) {
        RowCounter.Tally tally = RowCounter.countWholeFile(head, encoding.bomLength(),
            encoding.charset(), text, layout.dataStart(), parser, layout.width());
        return new DataRows(rows, tally.records() - tally.footer(), tally.footer());
      }
      return new DataRows(rows, RowCounter.estimate(rows, text, layout.dataStart(), decodedBytes,
          encoding.bomLength(), fileSize, warnings), 0);
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

    private static boolean isBlank(String text, int from, int to) {
      for (int i = from; i < to; i++) {
        if (!Character.isWhitespace(text.charAt(i))) {
          return false;
        }
      }
      return true;
    }

    private static List<CsvRecord> recordsFrom(List<CsvRecord> records, int offset) {
      int i = 0;
      while (i < records.size() && records.get(i).start() < offset) {
        i++;
      }
      return records.subList(i, records.size());
    }

    private void warnRagged(List<CsvRecord> rows, int width) {
      long ragged = rows.stream().filter(r -> r.width() != width).count();
      if (ragged > 0) {
        warnings.add(ragged + " data row(s) do not have " + width + " cells");
      }
    }
  }

  /** The rows profiled, the data rows counted, and the footer records left out. */
  private record DataRows(List<CsvRecord> profiled, long rowCount, int footer) {}
}
