package org.headwater.harvest.format.csv;

/**
 * Bounds on the work of one sniff.
 *
 * @param scoringChars characters of the sample on which every candidate dialect is scored
 * @param scoringRows records scored per candidate dialect
 * @param profileBytes bytes of the input decoded and parsed for header and column profiles
 * @param profileRows data rows profiled; a whole file beyond this is only counted
 */
public record SniffLimits(int scoringChars, int scoringRows, int profileBytes, int profileRows) {

  /** 64 KiB and 2,000 rows for dialect scoring; 8 MiB and 100,000 rows for profiles. */
  public static final SniffLimits DEFAULT = new SniffLimits(64 * 1024, 2_000, 8 << 20, 100_000);

  public SniffLimits {
    if (scoringChars < 1 || scoringRows < 1 || profileBytes < 1 || profileRows < 1) {
      throw new IllegalArgumentException("limits must be positive");
    }
  }
}
