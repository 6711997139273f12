package org.headwater.harvest.format.csv;

import java.util.ArrayList;
import java.util.List;

/**
 * Splits delimited text into records for one {@link Dialect}.
 *
 * <p>Follows RFC 4180 section 2 (quoted fields may hold delimiters, line breaks and doubled
 * quotes) and accepts CR, LF and CRLF as terminators. It is lenient where files in the wild
 * break the rules, and counts each such break as an irregularity instead of failing: text after
 * a closing quote is kept, a quote inside an unquoted field is literal, a quote left open at
 * the end of the file closes there. Blank lines are skipped, as most readers do (common
 * practice, no source). A backslash escape makes the next character literal anywhere.
 */
public final class CsvParser {

  private final Dialect dialect;

  public CsvParser(Dialect dialect) {
    this.dialect = dialect;
  }

  public Dialect dialect() {
    return dialect;
  }

  /** Splits a complete text into rows of cells. */
  public List<List<String>> parseAll(CharSequence text) {
    List<List<String>> rows = new ArrayList<>();
    for (CsvRecord record : parse(text, 0, Integer.MAX_VALUE, true).records()) {
      rows.add(record.cells());
    }
    return rows;
  }

  /**
   * Splits records from {@code from} on.
   *
   * @param maxRecords stop after this many complete records
   * @param endOfFile whether the text ends where the file ends; if not, a record that reaches
   *     the end of the text may continue beyond it and is left out
   */
  public ParsedRecords parse(CharSequence text, int from, int maxRecords, boolean endOfFile) {
    return parse(text, from, text.length(), maxRecords, endOfFile);
  }

  /**
   * Splits records of {@code text[from, to)}; offsets in the result are offsets in
   * {@code text}. With {@code endOfFile} false, {@code to} is treated as the cut of a sample.
   */
  public ParsedRecords parse(CharSequence text, int from, int to, int maxRecords,
      boolean endOfFile) {
    Scan scan = new Scan(text, from, to, endOfFile, true);
    List<CsvRecord> records = new ArrayList<>();
    while (records.size() < maxRecords) {
      int start = scan.skipBlankLines();
      if (start >= to) {
        break;
      }
      List<String> cells = scan.record();
      if (cells == null) {
        break;
      }
      records.add(new CsvRecord(cells, start, scan.pos));
    }
    int end = records.isEmpty() ? from : records.get(records.size() - 1).end();
    return new ParsedRecords(records, end, scan.truncated, scan.irregularities,
        scan.quotedFields, scan.escapes,
        scan.specialEscapes, scan.counts());
  }

  /**
   * Counts the non-blank records from {@code from} to the end of a complete text without
   * building cells, and remembers where the last {@code keepLast} of them start.
   */
  public RecordCount count(CharSequence text, int from, int keepLast) {
    Scan scan = new Scan(text, from, text.length(), true, false);
    long records = 0;
    int[] lastStarts = new int[Math.max(keepLast, 0)];
    while (true) {
      int start = scan.skipBlankLines();
      if (start >= text.length() || scan.record() == null) {
        break;
      }
      if (lastStarts.length > 0) {
        lastStarts[(int) (records % lastStarts.length)] = start;
      }
      records++;
    }
    int kept = (int) Math.min(records, lastStarts.length);
    int[] ordered = new int[kept];
    for (int k = 0; k < kept; k++) {
      ordered[k] = lastStarts[(int) ((records - kept + k) % lastStarts.length)];
    }
    return new RecordCount(records, ordered, scan.counts());
  }

  /**
   * The cell count of each complete record from the start of {@code text}, without building
   * cells: enough for the pattern score, and several times cheaper than {@link #parse}.
   */
  public int[] widths(CharSequence text, int from, int to, int maxRecords, boolean endOfFile) {
    Scan scan = new Scan(text, from, to, endOfFile, false);
    int[] widths = new int[64];
    int n = 0;
    while (n < maxRecords) {
      int start = scan.skipBlankLines();
      if (start >= to || scan.record() == null) {
        break;
      }
      if (n == widths.length) {
        widths = java.util.Arrays.copyOf(widths, n * 2);
      }
      widths[n++] = scan.fields;
    }
    return java.util.Arrays.copyOf(widths, n);
  }

  /** A record count and the start offsets of the last few records, oldest first. */
  public record RecordCount(long records, int[] lastStarts, TerminatorCounts terminators) {}

  /** The state of one pass over a text. */
  private final class Scan {
    private final CharSequence text;
    private final int end;
    private final boolean endOfFile;
    private final boolean build;
    private final char delimiter = dialect.delimiter();
    private final boolean backslash = dialect.escape() == Escape.BACKSLASH;
    private final boolean doubled = dialect.escape() == Escape.DOUBLE;
    private final StringBuilder cell = new StringBuilder();
    /** The cells of the record being read; each complete record takes an exact copy. */
    private final List<String> gathered = new ArrayList<>();
    private int pos;
    /** Fields of the record read last. */
    private int fields;
    private boolean truncated;
    private int irregularities;
    private int quotedFields;
    private int escapes;
    private int specialEscapes;
    private final int[] countsAtRecordStart = new int[4];
    private long lf;
    private long crlf;
    private long cr;

    Scan(CharSequence text, int from, int to, boolean endOfFile, boolean build) {
      this.text = text;
      this.end = to;
      this.pos = from;
      this.endOfFile = endOfFile;
      this.build = build;
    }

    TerminatorCounts counts() {
      return new TerminatorCounts(lf, crlf, cr);
    }

    int skipBlankLines() {
      while (pos < end) {
        char c = text.charAt(pos);
        if (c != '\r' && c != '\n') {
          break;
        }
        consumeTerminator();
      }
      return pos;
    }

    /** Reads one record from {@code pos}; null when the text ends before the record does. */
    List<String> record() {
      int restart = pos;
      countsAtRecordStart[0] = irregularities;
      countsAtRecordStart[1] = quotedFields;
      countsAtRecordStart[2] = escapes;
      countsAtRecordStart[3] = specialEscapes;
      List<String> cells = build ? gathered : null;
      if (build) {
        gathered.clear();
      }
      fields = 0;
      while (true) {
        boolean complete = field();
        if (!complete) {
          return abandon(restart);
        }
        fields++;
        if (build) {
          cells.add(cell.toString());
        }
        if (pos >= end) {
          // A record reaching the end of a cut sample may go on in the unread bytes.
          return endOfFile ? finished(cells) : abandon(restart);
        }
        char c = text.charAt(pos);
        if (c == delimiter) {
          pos++;
          if (pos >= end && endOfFile) {
            fields++;
            if (build) {
              cells.add("");
            }
          }
          if (pos >= end) {
            return endOfFile ? finished(cells) : abandon(restart);
          }
          continue;
        }
        consumeTerminator();
        return finished(cells);
      }
    }

    private List<String> finished(List<String> cells) {
      return cells == null ? List.of() : CellArray.of(cells);
    }

    /** Forgets a record cut by the end of a sample, and what was counted in it. */
    private List<String> abandon(int restart) {
      truncated = true;
      pos = restart;
      irregularities = countsAtRecordStart[0];
      quotedFields = countsAtRecordStart[1];
      escapes = countsAtRecordStart[2];
      specialEscapes = countsAtRecordStart[3];
      return null;
    }

    private void consumeTerminator() {
      char c = text.charAt(pos++);
      if (c == '\r') {
        if (pos < end && text.charAt(pos) == '\n') {
          pos++;
          crlf++;
        } else {
          cr++;
        }
      } else {
        lf++;
      }
    }

    /** Reads one field into {@code cell}; false when a cut sample ends inside it. */
    private boolean field() {
      cell.setLength(0);
      boolean quoted = pos < end && dialect.isQuote(text.charAt(pos));
      if (quoted) {
        if (!quotedPart()) {
          return false;
        }
        quotedFields++;
      }
      return unquotedPart(quoted);
    }

    /** Reads a quoted section starting at the opening quote; false when it is cut. */
    private boolean quotedPart() {
      char quote = dialect.quote();
      pos++;
      int runStart = pos;
      while (true) {
        if (pos >= end) {
          if (!endOfFile) {
            return false;
          }
          append(runStart, pos);
          irregularities++;
          return true;
        }
        char c = text.charAt(pos);
        if (c == quote) {
          append(runStart, pos);
          if (doubled) {
            if (pos + 1 >= end && !endOfFile) {
              return false;
            }
            if (pos + 1 < end && text.charAt(pos + 1) == quote) {
              appendChar(quote);
              pos += 2;
              runStart = pos;
              continue;
            }
          }
          pos++;
          return true;
        }
        if (backslash && c == '\\') {
          append(runStart, pos);
          if (pos + 1 >= end) {
            if (!endOfFile) {
              return false;
            }
            appendChar(c);
            pos++;
          } else {
            escaped(text.charAt(pos + 1));
            pos += 2;
          }
          runStart = pos;
          continue;
        }
        pos++;
      }
    }

    /**
     * Reads up to the next delimiter or line break. {@code afterQuote} says a quoted section
     * came first, in which case any text here breaks RFC 4180 section 2 rule 5.
     */
    private boolean unquotedPart(boolean afterQuote) {
      int runStart = pos;
      boolean irregular = false;
      while (pos < end) {
        char c = text.charAt(pos);
        if (c == delimiter || c == '\n' || c == '\r') {
          break;
        }
        if (backslash && c == '\\') {
          append(runStart, pos);
          if (pos + 1 >= end) {
            if (!endOfFile) {
              return false;
            }
            appendChar(c);
            pos++;
          } else {
            escaped(text.charAt(pos + 1));
            pos += 2;
          }
          runStart = pos;
          continue;
        }
        if (afterQuote || dialect.isQuote(c)) {
          irregular = true;
        }
        pos++;
      }
      append(runStart, pos);
      if (irregular) {
        irregularities++;
      }
      return true;
    }

    /** Appends an escaped character and notes whether the escape was needed. */
    private void escaped(char c) {
      appendChar(c);
      escapes++;
      if (c == delimiter || c == '\\' || c == '\n' || c == '\r' || dialect.isQuote(c)) {
        specialEscapes++;
      }
    }

    private void append(int from, int to) {
      if (build && to > from) {
        cell.append(text, from, to);
      }
    }

    private void appendChar(char c) {
      if (build) {
        cell.append(c);
      }
    }
  }
}
