package org.headwater.harvest.format;

/**
 * What {@link ContentSniffer} decided about a file's content.
 *
 * @param format one of {@code parquet png jpeg gif pdf svg json ndjson text binary}
 * @param confidence from 0 to 1: 1 for a signature confirmed at both ends, about 0.95 for a signature or a full
 *     parse, lower when the sample ended before the evidence did or the file name broke a tie
 * @param reason one sentence saying what was seen, for logs and the harvest summary
 */
public record Sniff(String format, double confidence, String reason) {
}
