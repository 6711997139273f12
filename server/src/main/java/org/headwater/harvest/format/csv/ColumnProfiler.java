package org.headwater.harvest.format.csv;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.List;
import org.apache.datasketches.hll.HllSketch;

/**
 * Profiles the columns of the data rows: type, missing cells, min and max in the type's
 * order, and a distinct-count estimate.
 *
 * <p>Distinct counts use Apache DataSketches' HyperLogLog sketch (lgK 12: a few KiB per column,
 * about 1.6% relative error, exact for small counts) rather than a hash set, whose memory
 * grows with the data. Values are counted as written, so "1.0" and "1" are two values. No
 * values are kept beyond min and max: listing frequent values is off for privacy.
 */
final class ColumnProfiler {

  private static final int LG_K = 12;

  private ColumnProfiler() {}

  /**
   * @param names one name per column
   * @param rows data rows; cells beyond the column count are ignored, missing ones are null
   * @param warnings receives notes about sentinels and ambiguous dates
   */
  static List<ColumnProfile> profile(List<String> names, List<CsvRecord> rows,
      NumberConvention convention, List<String> warnings) {
    return profile(names, rows, convention, warnings, ColumnStats.ALL);
  }

  /**
   * As above, working out only what {@code stats} asks for. Without extremes every minimum and
   * maximum is null, which spares reading each number, date and truth value a second time: a number
   * is then parsed only when it does not start with a digit, since only those can be negative or a
   * sentinel. Without distinct counts no sketch is kept and the estimate is -1.
   */
  static List<ColumnProfile> profile(List<String> names, List<CsvRecord> rows,
      NumberConvention convention, List<String> warnings, ColumnStats stats) {
    List<ColumnProfile> profiles = new ArrayList<>(names.size());
    for (int column = 0; column < names.size(); column++) {
      ColumnTypeInference inference = new ColumnTypeInference(convention);
      for (CsvRecord row : rows) {
        if (column < row.width()) {
          inference.add(row.cells().get(column));
        }
      }
      profiles.add(statistics(names.get(column), column, inference, rows, convention, warnings,
          stats));
    }
    return profiles;
  }

  private static ColumnProfile statistics(String name, int column, ColumnTypeInference inference,
      List<CsvRecord> rows, NumberConvention convention, List<String> warnings, ColumnStats stats) {
    boolean extremes = stats == ColumnStats.ALL;
    LogicalType type = inference.type();
    TemporalPattern temporal = inference.temporal();
    boolean numeric = type == LogicalType.INTEGER || type == LogicalType.DECIMAL;
    HllSketch distinct = stats == ColumnStats.TYPES_AND_NULLS ? null : new HllSketch(LG_K);
    Extremes seen = new Extremes();
    Extremes sentinelExtremes = new Extremes();
    long nulls = 0;
    long sentinels = 0;
    long kept = 0;
    boolean negatives = false;
    List<String> sentinelSpellings = new ArrayList<>(2);
    for (CsvRecord row : rows) {
      if (column >= row.width()) {
        nulls++;
        continue;
      }
      String value = Cells.trim(row.cells().get(column));
      if (MissingValues.isMissing(value)) {
        nulls++;
        continue;
      }
      if (numeric && (extremes || !NumberScanner.isDigit(value.charAt(0)))) {
        BigDecimal number = number(value, convention);
        if (MissingValues.isSentinel(number)) {
          sentinels++;
          if (!sentinelSpellings.contains(value)) {
            sentinelSpellings.add(value);
          }
          if (extremes) {
            sentinelExtremes.offer(number, value);
          }
          continue;
        }
        negatives |= number.signum() < 0;
        if (extremes) {
          seen.offer(number, value);
        }
      } else if (extremes) {
        seen.offer(key(type, value, convention, temporal), value);
      }
      kept++;
      if (distinct != null) {
        distinct.update(value);
      }
    }
    if (sentinels > 0) {
      if (!negatives && kept > 0) {
        nulls += sentinels;
        warnings.add("column " + name + ": " + sentinels + " cell(s) " + sentinelSpellings
            + " counted as missing: a sentinel in a column never otherwise below zero");
      } else {
        if (distinct != null) {
          sentinelSpellings.forEach(distinct::update);
        }
        seen.offer(sentinelExtremes.minKey, sentinelExtremes.min);
        seen.offer(sentinelExtremes.maxKey, sentinelExtremes.max);
      }
    }
    boolean temporalType = type == LogicalType.DATE || type == LogicalType.TIMESTAMP;
    if (temporalType && temporal.ambiguousOrder()) {
      warnings.add("column " + name + ": day and month order is ambiguous (no day above 12); "
          + "assumed " + temporal.pattern());
    }
    long distinctEstimate = distinct == null ? -1
        : distinct.isEmpty() ? 0 : Math.round(distinct.getEstimate());
    return new ColumnProfile(name, type, temporalType ? temporal.pattern() : null, nulls,
        seen.min, seen.max, distinctEstimate, nulls > 0);
  }

  /**
   * The value's position in its type's order, computed once per value: numbers by value,
   * false before true, dates and timestamps by instant (local ones as if at UTC), text in the
   * JDK's natural String order (UTF-16 code units).
   */
  private static Comparable<?> key(LogicalType type, String value, NumberConvention convention,
      TemporalPattern temporal) {
    return switch (type) {
      case INTEGER, DECIMAL -> number(value, convention);
      case BOOLEAN -> Cells.booleanValue(value, 0, value.length());
      case DATE, TIMESTAMP -> {
        TemporalShape shape = TemporalScanner.scan(value, 0, value.length());
        yield new Instant(temporal.sortKeySeconds(shape), shape.nanos());
      }
      case TEXT -> value;
    };
  }

  /** A point in time to sort by: seconds, then nanoseconds. */
  private record Instant(long seconds, int nanos) implements Comparable<Instant> {
    @Override
    public int compareTo(Instant other) {
      int bySeconds = Long.compare(seconds, other.seconds);
      return bySeconds != 0 ? bySeconds : Integer.compare(nanos, other.nanos);
    }
  }

  /** The smallest and largest value seen, with their spellings. */
  private static final class Extremes {
    private Comparable<?> minKey;
    private Comparable<?> maxKey;
    private String min;
    private String max;

    @SuppressWarnings({"unchecked", "rawtypes"})
    void offer(Comparable<?> key, String value) {
      if (key == null) {
        return;
      }
      if (minKey == null || ((Comparable) key).compareTo(minKey) < 0) {
        minKey = key;
        min = value;
      }
      if (maxKey == null || ((Comparable) key).compareTo(maxKey) > 0) {
        maxKey = key;
        max = value;
      }
    }
  }

  private static BigDecimal number(String value, NumberConvention convention) {
    boolean plain = convention.decimal() == '.' && value.indexOf(',') < 0
        && (convention.group() == null || value.indexOf(convention.group()) < 0);
    if (plain) {
      BigDecimal small = smallDecimal(value);
      return small != null ? small : new BigDecimal(value);
    }
    return new BigDecimal(NumberScanner.normalize(value, 0, value.length(), convention));
  }

  /**
   * {@code new BigDecimal(value)} for the common case, an optional sign, digits and an optional '.'
   * with digits, 18 digits at most, without parsing a string into a BigInteger: the same unscaled
   * value and scale, so the same order and the same equality. Null for anything else (exponents,
   * longer numbers), which the caller hands to {@code BigDecimal(String)}.
   */
  static BigDecimal smallDecimal(String value) {
    int n = value.length();
    int i = 0;
    boolean negative = false;
    if (i < n && (value.charAt(i) == '-' || value.charAt(i) == '+')) {
      negative = value.charAt(i) == '-';
      i++;
    }
    long unscaled = 0;
    int digits = 0;
    int scale = -1;
    for (; i < n; i++) {
      char c = value.charAt(i);
      if (c >= '0' && c <= '9') {
        if (++digits > 18) {
          return null;
        }
        unscaled = unscaled * 10 + (c - '0');
        if (scale >= 0) {
          scale++;
        }
      } else if (c == '.' && scale < 0) {
        scale = 0;
      } else {
        return null;
      }
    }
    if (digits == 0) {
      return null;
    }
    return BigDecimal.valueOf(negative ? -unscaled : unscaled, Math.max(0, scale));
  }
}
