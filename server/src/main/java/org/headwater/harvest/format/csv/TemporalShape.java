package org.headwater.harvest.format.csv;

/**
 * The layout and fields of one date, time or timestamp value, as found by {@link
 * TemporalScanner}. A date like 03/04/2021 fits two field orders; {@code orders} holds both.
 *
 * @param kind {@link #DATE}, {@link #TIME} or {@link #TIMESTAMP}
 * @param orders bit set of {@link #YMD}, {@link #DMY}, {@link #MDY} (0 for a time)
 * @param dateSeparator '-', '/' or '.'
 * @param first first date number, {@code second} and {@code third} follow
 * @param firstWidth digits written for each date number; likewise the next two
 * @param timeSeparator 'T' or ' ' between date and time (0 when there is no date)
 * @param hourWidth 1 or 2
 * @param seconds whether seconds were written
 * @param fractionDigits digits after the seconds (0 when none)
 * @param zone {@link #NO_ZONE}, {@link #ZONE_COLON} (Z or +01:00), {@link #ZONE_COMPACT}
 *     (+0100) or {@link #ZONE_HOURS} (+01)
 */
record TemporalShape(
    int kind, int orders, char dateSeparator,
    int first, int second, int third, int firstWidth, int secondWidth, int thirdWidth,
    char timeSeparator, int hour, int minute, int secondOfMinute, int nanos,
    int hourWidth, boolean seconds, int fractionDigits, int zone, int offsetSeconds) {

  static final int DATE = 1;
  static final int TIME = 2;
  static final int TIMESTAMP = 3;

  static final int YMD = 1;
  static final int DMY = 2;
  static final int MDY = 4;

  static final int NO_ZONE = 0;
  static final int ZONE_COLON = 1;
  static final int ZONE_COMPACT = 2;
  static final int ZONE_HOURS = 3;
}
