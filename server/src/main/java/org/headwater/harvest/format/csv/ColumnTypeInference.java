package org.headwater.harvest.format.csv;

/**
 * Narrows the logical type of one column value by value: a column is INTEGER while every
 * non-missing value is a whole number, DECIMAL while every one is a number, and so on; the
 * first value that fits nothing makes it TEXT.
 *
 * <p>Integers written with a leading zero ("08123") make a column TEXT: such values are codes
 * (postcodes, telephone numbers) whose zeros a number type would drop (common practice, no
 * source). Numbers with a currency sign or % are TEXT too: the catalog would misstate them as
 * plain numbers.
 */
final class ColumnTypeInference {

  private final NumberConvention convention;
  private boolean integer = true;
  private boolean decimal = true;
  private boolean bool = true;
  private boolean temporal = true;
  private final TemporalPattern temporalPattern = new TemporalPattern();
  private long values;

  ColumnTypeInference(NumberConvention convention) {
    this.convention = convention;
  }

  void add(String raw) {
    int from = Cells.trimStart(raw);
    int to = Cells.trimEnd(raw, from);
    if (MissingValues.isMissing(raw, from, to)) {
      return;
    }
    values++;
    char c = raw.charAt(from);
    boolean numericStart = NumberScanner.isDigit(c) || c == '-' || c == '+' || c == '.'
        || c == convention.decimal();
    if (integer || decimal) {
      int result = numericStart
          ? NumberScanner.scan(raw, from, to, convention) : NumberScanner.NONE;
      if (result == NumberScanner.NONE || NumberScanner.has(result, NumberScanner.LEADING_ZERO)) {
        integer = false;
        decimal = false;
      } else if (NumberScanner.kind(result) == NumberScanner.DECIMAL) {
        integer = false;
      }
    }
    if (bool && Cells.booleanValue(raw, from, to) == null) {
      bool = false;
    }
    if (temporal) {
      TemporalShape shape = NumberScanner.isDigit(c) ? TemporalScanner.scan(raw, from, to) : null;
      if (shape == null || !temporalPattern.add(shape)) {
        temporal = false;
      }
    }
  }

  /** Whether any non-missing value was added. */
  boolean hasValues() {
    return values > 0;
  }

  LogicalType type() {
    if (values == 0) {
      return LogicalType.TEXT;
    }
    if (integer) {
      return LogicalType.INTEGER;
    }
    if (decimal) {
      return LogicalType.DECIMAL;
    }
    if (bool) {
      return LogicalType.BOOLEAN;
    }
    return temporal ? temporalPattern.type() : LogicalType.TEXT;
  }

  /** The temporal accumulator, meaningful when {@link #type()} is DATE or TIMESTAMP. */
  TemporalPattern temporal() {
    return temporalPattern;
  }

  /** The type of a single value on its own (TEXT when missing). */
  static LogicalType typeOf(String value, NumberConvention convention) {
    ColumnTypeInference one = new ColumnTypeInference(convention);
    one.add(value);
    return one.type();
  }

  /** Whether a single trimmed value fits {@code type} under this column's convention. */
  static boolean fits(String value, LogicalType type, NumberConvention convention) {
    ColumnTypeInference one = new ColumnTypeInference(convention);
    one.add(value);
    if (!one.hasValues()) {
      return true;
    }
    LogicalType own = one.type();
    return own == type || type == LogicalType.DECIMAL && own == LogicalType.INTEGER
        || type == LogicalType.TEXT;
  }
}
