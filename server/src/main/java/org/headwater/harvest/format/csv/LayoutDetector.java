package org.headwater.harvest.format.csv;

import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/** Finds where the table starts and ends: the sep= line, comments, preamble and footer. */
final class LayoutDetector {

  /** Bounds on how much non-table text a file may have around its table (our choice). */
  static final int MAX_LEADING = 100;
  static final int MAX_FOOTER = 5;

  private static final Set<String> TOTAL_WORDS =
      Set.of("total", "totals", "grand total", "subtotal", "sum", "summe", "gesamt", "totaal");

  private LayoutDetector() {}

  /**
   * Passes over an Excel-style {@code sep=X} first line (a convention of Microsoft Excel,
   * which reads it to choose the delimiter) and over lines starting with '#'.
   */
  static LeadingLines leading(CharSequence text) {
    int offset = 0;
    char forced = 0;
    if (text.length() >= 5 && regionMatchesIgnoreCase(text, 0, "sep=")) {
      int after = 5;
      if (after == text.length() || isBreak(text.charAt(after))) {
        forced = text.charAt(4);
        offset = nextLine(text, 4);
      }
    }
    int comments = 0;
    while (comments < MAX_LEADING && offset < text.length() && text.charAt(offset) == '#') {
      offset = nextLine(text, offset);
      comments++;
    }
    return new LeadingLines(offset, forced, comments);
  }

  /**
   * The most frequent record width in the second half of the records (a preamble, however
   * long, sits in the first); the wider wins a tie.
   */
  static int modalWidth(List<CsvRecord> records) {
    Map<Integer, Integer> counts = new HashMap<>();
    int best = 0;
    int bestCount = 0;
    for (CsvRecord record : records.subList(records.size() / 2, records.size())) {
      int count = counts.merge(record.width(), 1, Integer::sum);
      if (count > bestCount || count == bestCount && record.width() > best) {
        best = record.width();
        bestCount = count;
      }
    }
    return best;
  }

  static double shareOfWidth(List<CsvRecord> records, int width) {
    if (records.isEmpty()) {
      return 0.0;
    }
    long matching = records.stream().filter(r -> r.width() == width).count();
    return matching / (double) records.size();
  }

  /**
   * Leading records that are not part of the table: those of another width (titles, notes),
   * and, in tables of three or more columns, padded title rows such as "Report;;;;" whose
   * filled cells are a short prefix (at most half) while one of the next three records is
   * fuller. A data row with only its first cells filled, above fuller rows, is mistaken for a
   * title: we accept that.
   */
  static int preambleRecords(List<CsvRecord> records, int width) {
    int p = 0;
    while (p < records.size() - 1 && p < MAX_LEADING) {
      CsvRecord record = records.get(p);
      if (record.width() != width || width >= 3 && paddedTitle(record, records, p + 1)) {
        p++;
      } else {
        break;
      }
    }
    return p;
  }

  /** Looks ahead a few records, past blank padded rows, for a fuller one. */
  private static boolean paddedTitle(CsvRecord record, List<CsvRecord> records, int next) {
    int filled = filledPrefix(record);
    if (filled < 0 || filled * 2 > record.width()) {
      return false;
    }
    for (int i = next; i < Math.min(records.size(), next + 3); i++) {
      if (filledCells(records.get(i)) > filled) {
        return true;
      }
    }
    return false;
  }

  /** The number of filled cells if they are all at the start, else -1. */
  private static int filledPrefix(CsvRecord record) {
    int filled = 0;
    boolean gap = false;
    for (String cell : record.cells()) {
      if (Cells.trim(cell).isEmpty()) {
        gap = true;
      } else if (gap) {
        return -1;
      } else {
        filled++;
      }
    }
    return filled;
  }

  private static int filledCells(CsvRecord record) {
    int filled = 0;
    for (String cell : record.cells()) {
      if (!Cells.trim(cell).isEmpty()) {
        filled++;
      }
    }
    return filled;
  }

  /**
   * Trailing records that are not data: another width, a '#' comment, or a first filled cell
   * that is a word for a total ("Total", "Summe", ...). At most {@link #MAX_FOOTER}.
   */
  static int footerRecords(List<CsvRecord> records, int width, int firstDataIndex) {
    int footer = 0;
    for (int i = records.size() - 1; i > firstDataIndex && footer < MAX_FOOTER; i--) {
      if (!isFooter(records.get(i), width)) {
        break;
      }
      footer++;
    }
    return footer;
  }

  static boolean isFooter(CsvRecord record, int width) {
    if (record.width() != width) {
      return true;
    }
    for (String raw : record.cells()) {
      String cell = Cells.trim(raw);
      if (!cell.isEmpty()) {
        String word = cell.toLowerCase(Locale.ROOT);
        if (word.endsWith(":")) {
          word = word.substring(0, word.length() - 1);
        }
        return cell.startsWith("#") || TOTAL_WORDS.contains(word);
      }
    }
    return false;
  }

  /** Line breaks (CRLF counted once) in {@code text[0, end)}. */
  static int physicalLines(CharSequence text, int end) {
    int lines = 0;
    for (int i = 0; i < end; i++) {
      char c = text.charAt(i);
      if (c == '\n') {
        lines++;
      } else if (c == '\r') {
        lines++;
        if (i + 1 < end && text.charAt(i + 1) == '\n') {
          i++;
        }
      }
    }
    return lines;
  }

  private static int nextLine(CharSequence text, int from) {
    int i = from;
    while (i < text.length() && !isBreak(text.charAt(i))) {
      i++;
    }
    if (i < text.length() && text.charAt(i) == '\r') {
      i++;
    }
    if (i < text.length() && text.charAt(i) == '\n') {
      i++;
    }
    return i;
  }

  private static boolean isBreak(char c) {
    return c == '\n' || c == '\r';
  }

  private static boolean regionMatchesIgnoreCase(CharSequence text, int from, String word) {
    for (int k = 0; k < word.length(); k++) {
      if (Character.toLowerCase(text.charAt(from + k)) != word.charAt(k)) {
        return false;
      }
    }
    return true;
  }
}
