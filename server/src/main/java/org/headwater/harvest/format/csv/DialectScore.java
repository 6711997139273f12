package org.headwater.harvest.format.csv;

/**
 * The data-consistency score of one dialect on a sample.
 *
 * @param dialect the dialect scored
 * @param pattern P, the row-pattern score
 * @param type T, the share of cells of a known type ({@code NaN} when not computed because P
 *     alone could not beat the best score so far)
 * @param consistency Q = P x T
 * @param parsed the sample's records under this dialect; null when pruned on P
 */
record DialectScore(Dialect dialect, double pattern, double type, double consistency,
    ParsedRecords parsed) {}
