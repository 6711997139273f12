package org.headwater.harvest.format.csv;

/**
 * The number convention found in a file, and whether digit groups were actually seen.
 *
 * @param convention decimal and group separators used to read numbers
 * @param groupingSeen whether any number used the group separator
 * @param decimalSeen whether any number had a fraction written with the decimal separator
 */
record NumberFormat(NumberConvention convention, boolean groupingSeen, boolean decimalSeen) {

  /** The thousands separator to report: only one that occurred. */
  Character thousandsSeparator() {
    return groupingSeen ? convention.group() : null;
  }
}
