package org.headwater.search;

/**
 * One search result.
 *
 * @param kind {@code dataset} kinds (file, figure, …) or {@code script}
 * @param id the dataset or script id
 */
public record SearchHit(String kind, long id, String name, String uri, String format, String source, float score) {
}
