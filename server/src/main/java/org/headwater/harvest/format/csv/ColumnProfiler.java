package org.headwater.harvest.format.csv;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Comparator;
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
    List<ColumnProfile> profiles = new ArrayList<>(names.size());
    for (int column = 0; column < names.size(); column++) {
      ColumnTypeInference inference = new ColumnTypeInference(convention);
      for (CsvRecord row : rows) {
        if (column < row.width()) {
          inference.add(row.cells().get(column));
        }
      }
      profiles.add(statistics(names.get(column), column, inference, rows, convention, warnings));
    }
    return profiles;
  }

  private static ColumnProfile statistics(String name, int column, ColumnTypeInference inference,
      List<CsvRecord> rows, NumberConvention convention, List<String> warnings) {
    LogicalType type = inference.type();
    TemporalPattern temporal = inference.temporal();
    Comparator<String> order = order(type, convention, temporal);
    boolean numeric = type == LogicalType.INTEGER || type == LogicalType.DECIMAL;
    HllSketch distinct = new HllSketch(LG_K);
    long nulls = 0;
    String min = null;
    String max = null;
    long sentinels = 0;
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
      if (numeric) {
        BigDecimal number = number(value, convention);
        if (MissingValues.isSentinel(number)) {
          sentinels++;
          if (!sentinelSpellings.contains(value)) {
            sentinelSpellings.add(value);
          }
          continue;
        }
        negatives |= number.signum() < 0;
      }
      distinct.update(value);
      if (min == null || order.compare(value, min) < 0) {
        min = value;
      }
      if (max == null || order.compare(value, max) > 0) {
        max = value;
      }
    }
    if (sentinels > 0) {
      if (!negatives && min != null) {
        nulls += sentinels;
        warnings.add("column " + name + ": " + sentinels + " cell(s) " + sentinelSpellings
            + " counted as missing: a sentinel in a column never otherwise below zero");
      } else {
        for (String spelling : sentinelSpellings) {
          distinct.update(spelling);
          if (min == null || order.compare(spelling, min) < 0) {
            min = spelling;
          }
          if (max == null || order.compare(spelling, max) > 0) {
            max = spelling;
          }
        }
      }
    }
    if ((type == LogicalType.DATE || type == LogicalType.TIMESTAMP) && temporal.ambiguousOrder()) {
      warnings.add("column " + name + ": day and month order is ambiguous (no day above 12); "
          + "assumed " + temporal.pattern());
    }
    String pattern = type == LogicalType.DATE || type == LogicalType.TIMESTAMP
        ? temporal.pattern() : null;
    long distinctEstimate = distinct.isEmpty() ? 0 : Math.round(distinct.getEstimate());
    return new ColumnProfile(name, type, pattern, nulls, min, max, distinctEstimate, nulls > 0);
  }

  private static Comparator<String> order(LogicalType type, NumberConvention convention,
      TemporalPattern temporal) {
    return switch (type) {
      case INTEGER, DECIMAL -> Comparator.comparing(v -> number(v, convention));
      case BOOLEAN -> Comparator.comparing(v -> Cells.booleanValue(v, 0, v.length()));
      case DATE, TIMESTAMP -> Comparator
          .comparingLong((String v) -> temporal.sortKeySeconds(TemporalScanner.scan(v, 0, v.length())))
          .thenComparingInt(v -> TemporalScanner.scan(v, 0, v.length()).nanos());
      // UTF-16 code unit order: the JDK's natural String order.
      case TEXT -> Comparator.naturalOrder();
    };
  }

  private static BigDecimal number(String value, NumberConvention convention) {
    return new BigDecimal(NumberScanner.normalize(value, 0, value.length(), convention));
  }
}
