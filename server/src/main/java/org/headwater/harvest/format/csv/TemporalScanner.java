package org.headwater.harvest.format.csv;

/**
 * Recognises dates, times and timestamps by a character scan.
 *
 * <p>Dates are three numbers with one separator ('-', '/', '.'): a 4-digit year first
 * (ISO 8601 order) or last (day-month or month-day order, both kept when both are valid
 * calendar dates). Two-digit years and month names are not recognised: they are too easily
 * confused with other codes (our choice). A time is H:mm, optionally :ss and a fraction, then
 * optionally a zone as in ISO 8601 (Z, +01:00, +0100, +01). A timestamp is a date, 'T' or a
 * space, and a time.
 */
final class TemporalScanner {

  private TemporalScanner() {}

  /** Scans {@code s[from, to)}; returns its shape, or null when it is none of these. */
  static TemporalShape scan(CharSequence s, int from, int to) {
    if (to - from < 4 || !NumberScanner.isDigit(s.charAt(from))) {
      return null;
    }
    // A time alone starts with 1-2 digits and a colon.
    if (s.charAt(from + 1) == ':' || to - from > 2 && s.charAt(from + 2) == ':') {
      return time(s, from, to, 0, TemporalShape.TIME, (char) 0, (char) 0, 0, 0, 0, 0, 0, 0);
    }
    int[] groups = new int[3];
    int[] widths = new int[3];
    int i = from;
    char separator = 0;
    for (int g = 0; g < 3; g++) {
      int start = i;
      int value = 0;
      while (i < to && NumberScanner.isDigit(s.charAt(i)) && i - start < 4) {
        value = value * 10 + (s.charAt(i) - '0');
        i++;
      }
      widths[g] = i - start;
      groups[g] = value;
      if (widths[g] == 0) {
        return null;
      }
      if (g < 2) {
        if (i >= to) {
          return null;
        }
        char c = s.charAt(i);
        if (g == 0) {
          if (c != '-' && c != '/' && c != '.') {
            return null;
          }
          separator = c;
        } else if (c != separator) {
          return null;
        }
        i++;
      }
    }
    int orders = orders(groups, widths);
    if (orders == 0) {
      return null;
    }
    if (i == to) {
      return new TemporalShape(TemporalShape.DATE, orders, separator, groups[0], groups[1],
          groups[2], widths[0], widths[1], widths[2], (char) 0, 0, 0, 0, 0, 0, false, 0,
          TemporalShape.NO_ZONE, 0);
    }
    char t = s.charAt(i);
    if (t != 'T' && t != ' ') {
      return null;
    }
    return time(s, i + 1, to, orders, TemporalShape.TIMESTAMP, t, separator, groups[0],
        groups[1], groups[2], widths[0], widths[1], widths[2]);
  }

  private static int orders(int[] g, int[] w) {
    int orders = 0;
    if (w[0] == 4 && w[1] <= 2 && w[2] <= 2 && validDate(g[0], g[1], g[2])) {
      orders |= TemporalShape.YMD;
    }
    if (w[2] == 4 && w[0] <= 2 && w[1] <= 2) {
      if (validDate(g[2], g[1], g[0])) {
        orders |= TemporalShape.DMY;
      }
      if (validDate(g[2], g[0], g[1])) {
        orders |= TemporalShape.MDY;
      }
    }
    return orders;
  }

  static boolean validDate(int year, int month, int day) {
    if (month < 1 || month > 12 || day < 1) {
      return false;
    }
    return day <= java.time.YearMonth.of(year, month).lengthOfMonth();
  }

  private static TemporalShape time(CharSequence s, int from, int to, int orders, int kind,
      char timeSeparator, char dateSeparator, int g0, int g1, int g2, int w0, int w1, int w2) {
    int i = from;
    int hourStart = i;
    int hour = 0;
    while (i < to && NumberScanner.isDigit(s.charAt(i)) && i - hourStart < 2) {
      hour = hour * 10 + (s.charAt(i++) - '0');
    }
    int hourWidth = i - hourStart;
    if (hourWidth == 0 || hour > 23 || i >= to || s.charAt(i) != ':') {
      return null;
    }
    i++;
    int minute = twoDigits(s, i, to);
    if (minute < 0 || minute > 59) {
      return null;
    }
    i += 2;
    boolean seconds = false;
    int second = 0;
    int nanos = 0;
    int fraction = 0;
    if (i < to && s.charAt(i) == ':') {
      second = twoDigits(s, i + 1, to);
      if (second < 0 || second > 60) { // 60: a leap second, ISO 8601 allows it
        return null;
      }
      seconds = true;
      i += 3;
      if (i < to && (s.charAt(i) == '.' || s.charAt(i) == ',')) {
        i++;
        int start = i;
        while (i < to && NumberScanner.isDigit(s.charAt(i)) && i - start < 9) {
          nanos = nanos * 10 + (s.charAt(i++) - '0');
        }
        fraction = i - start;
        if (fraction == 0) {
          return null;
        }
        for (int k = fraction; k < 9; k++) {
          nanos *= 10;
        }
      }
    }
    int zone = TemporalShape.NO_ZONE;
    int offset = 0;
    if (i < to) {
      char z = s.charAt(i);
      if (z == 'Z' && i + 1 == to) {
        zone = TemporalShape.ZONE_COLON;
        i++;
      } else if (z == '+' || z == '-') {
        int sign = z == '-' ? -1 : 1;
        int hours = twoDigits(s, i + 1, to);
        if (hours < 0 || hours > 18) {
          return null;
        }
        i += 3;
        int minutes = 0;
        if (i == to) {
          zone = TemporalShape.ZONE_HOURS;
        } else if (s.charAt(i) == ':') {
          minutes = twoDigits(s, i + 1, to);
          zone = TemporalShape.ZONE_COLON;
          i += 3;
        } else {
          minutes = twoDigits(s, i, to);
          zone = TemporalShape.ZONE_COMPACT;
          i += 2;
        }
        if (minutes < 0 || minutes > 59) {
          return null;
        }
        offset = sign * (hours * 3600 + minutes * 60);
      }
    }
    if (i != to) {
      return null;
    }
    return new TemporalShape(kind, orders, dateSeparator, g0, g1, g2, w0, w1, w2,
        timeSeparator, hour, minute, second, nanos, hourWidth, seconds, fraction, zone, offset);
  }

  private static int twoDigits(CharSequence s, int i, int to) {
    if (i + 2 > to) {
      return -1;
    }
    char a = s.charAt(i);
    char b = s.charAt(i + 1);
    if (!NumberScanner.isDigit(a) || !NumberScanner.isDigit(b)) {
      return -1;
    }
    return (a - '0') * 10 + (b - '0');
  }
}
