package org.headwater.search;

/**
 * One search result.
 *
 * @param kind a dataset kind ({@code file}, {@code figure}, {@code table}, …), {@code column}, {@code script},
 *     {@code owner} or {@code team}
 * @param id the dataset id (also for a column: its dataset), script id or owner id
 * @param name the name; for a column {@code dataset#column}
 * @param snippet matched text with {@code <mark>} around the matches, everything else HTML-escaped; null when
 *     only the name matched
 * @param explain why it ranked where it did; null unless asked for
 */
public record SearchHit(String kind, long id, String name, String uri, String format, String source, float score,
        String snippet, HitExplanation explain) {
}
