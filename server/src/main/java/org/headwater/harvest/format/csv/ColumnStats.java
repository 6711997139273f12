package org.headwater.harvest.format.csv;

/** How much {@link ColumnProfiler} works out per column beyond its type and nullability. */
public enum ColumnStats {
  /** Null counts, distinct-count estimates and each column's minimum and maximum. */
  ALL,
  /**
   * As {@link #ALL} without minimum and maximum: cell values, which a harvest with value sampling
   * off would strip anyway.
   */
  NO_VALUES,
  /**
   * Types and null counts only, no distinct estimate (-1) and no extremes: all a partition of a
   * set keeps of its columns.
   */
  TYPES_AND_NULLS
}
