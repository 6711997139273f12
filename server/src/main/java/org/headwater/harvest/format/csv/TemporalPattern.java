package org.headwater.harvest.format.csv;

/**
 * Accumulates the {@link TemporalShape}s of one column and names their common
 * {@link java.time.format.DateTimeFormatter} pattern.
 */
final class TemporalPattern {

  private TemporalShape firstShape;
  private int orders = TemporalShape.YMD | TemporalShape.DMY | TemporalShape.MDY;
  private boolean compatible = true;
  private final int[] minWidth = {4, 4, 4};
  private int minHourWidth = 2;
  private int minFraction = 9;
  private int maxFraction;

  /** Adds a value; false once the column can no longer be one temporal type. */
  boolean add(TemporalShape shape) {
    if (!compatible) {
      return false;
    }
    if (firstShape == null) {
      firstShape = shape;
    } else if (shape.kind() != firstShape.kind()
        || shape.dateSeparator() != firstShape.dateSeparator()
        || shape.timeSeparator() != firstShape.timeSeparator()
        || shape.seconds() != firstShape.seconds()
        || shape.zone() != firstShape.zone()) {
      compatible = false;
      return false;
    }
    if (shape.kind() != TemporalShape.TIME) {
      orders &= shape.orders();
      if (orders == 0) {
        compatible = false;
        return false;
      }
    }
    minWidth[0] = Math.min(minWidth[0], shape.firstWidth());
    minWidth[1] = Math.min(minWidth[1], shape.secondWidth());
    minWidth[2] = Math.min(minWidth[2], shape.thirdWidth());
    minHourWidth = Math.min(minHourWidth, shape.hourWidth());
    minFraction = Math.min(minFraction, shape.fractionDigits());
    maxFraction = Math.max(maxFraction, shape.fractionDigits());
    return true;
  }

  boolean compatible() {
    return compatible && firstShape != null;
  }

  /** DATE or TIMESTAMP, or TEXT for a column of times alone (no logical type of its own). */
  LogicalType type() {
    if (!compatible()) {
      return LogicalType.TEXT;
    }
    return switch (firstShape.kind()) {
      case TemporalShape.DATE -> LogicalType.DATE;
      case TemporalShape.TIMESTAMP -> LogicalType.TIMESTAMP;
      default -> LogicalType.TEXT;
    };
  }

  /**
   * The field order in use. When several fit every value (all days up to 12) ISO order wins,
   * then day-month-year (used by most of the world) over month-day-year (our choice).
   */
  int order() {
    if ((orders & TemporalShape.YMD) != 0) {
      return TemporalShape.YMD;
    }
    return (orders & TemporalShape.DMY) != 0 ? TemporalShape.DMY : TemporalShape.MDY;
  }

  boolean ambiguousOrder() {
    return Integer.bitCount(orders) > 1;
  }

  String pattern() {
    if (!compatible() || firstShape.kind() == TemporalShape.TIME) {
      return null;
    }
    char sep = firstShape.dateSeparator();
    String[] letters = switch (order()) {
      case TemporalShape.YMD ->
          new String[] {"yyyy", field('M', minWidth[1]), field('d', minWidth[2])};
      case TemporalShape.DMY ->
          new String[] {field('d', minWidth[0]), field('M', minWidth[1]), "yyyy"};
      default -> new String[] {field('M', minWidth[0]), field('d', minWidth[1]), "yyyy"};
    };
    StringBuilder p = new StringBuilder()
        .append(letters[0]).append(sep).append(letters[1]).append(sep).append(letters[2]);
    if (firstShape.kind() == TemporalShape.TIMESTAMP) {
      p.append(firstShape.timeSeparator() == 'T' ? "'T'" : " ");
      p.append(minHourWidth == 1 ? "H" : "HH").append(":mm");
      if (firstShape.seconds()) {
        p.append(":ss");
      }
      if (maxFraction > 0) {
        String fraction = "." + "S".repeat(maxFraction);
        // Widths that vary (as Python's isoformat writes them) make the fraction optional.
        p.append(minFraction == maxFraction ? fraction : "[" + fraction + "]");
      }
      p.append(switch (firstShape.zone()) {
        case TemporalShape.ZONE_COLON -> "XXX";
        case TemporalShape.ZONE_COMPACT -> "XX";
        case TemporalShape.ZONE_HOURS -> "X";
        default -> "";
      });
    }
    return p.toString();
  }

  private static String field(char letter, int width) {
    return width >= 2 ? String.valueOf(letter).repeat(2) : String.valueOf(letter);
  }

  /** A sort key for a value of this column, in the chosen field order. */
  long sortKeySeconds(TemporalShape s) {
    int year;
    int month;
    int day;
    switch (order()) {
      case TemporalShape.YMD -> {
        year = s.first();
        month = s.second();
        day = s.third();
      }
      case TemporalShape.DMY -> {
        year = s.third();
        month = s.second();
        day = s.first();
      }
      default -> {
        year = s.third();
        month = s.first();
        day = s.second();
      }
    }
    long days = java.time.LocalDate.of(year, month, day).toEpochDay();
    long seconds = days * 86_400L + s.hour() * 3600L + s.minute() * 60L + s.secondOfMinute();
    return seconds - s.offsetSeconds();
  }
}
