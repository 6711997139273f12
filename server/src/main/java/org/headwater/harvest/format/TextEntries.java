package org.headwater.harvest.format;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Keyword-to-text pairs read out of a file (PNG text chunks, SVG Dublin Core, PDF Info), bounded so one odd
 * file cannot bloat the catalog: at most {@link #MAX_ENTRIES} entries of at most {@link #MAX_CHARS}
 * characters each. A keyword seen twice keeps both texts, one per line.
 */
final class TextEntries {
    static final int MAX_ENTRIES = 64;
    static final int MAX_CHARS = 4096;

    private final Map<String, String> entries = new LinkedHashMap<>();
    private boolean truncated;

    void put(String keyword, String text) {
        String key = cut(keyword);
        String previous = entries.get(key);
        if (previous == null && entries.size() >= MAX_ENTRIES) {
            truncated = true;
            return;
        }
        entries.put(key, cut(previous == null ? text : previous + "\n" + text));
    }

    /** Marks that a value was cut before it got here (a compressed text inflated only up to the cap). */
    void markTruncated() {
        truncated = true;
    }

    String cut(String text) {
        if (text.length() <= MAX_CHARS) {
            return text;
        }
        truncated = true;
        return text.substring(0, MAX_CHARS);
    }

    boolean truncated() {
        return truncated;
    }

    boolean isEmpty() {
        return entries.isEmpty();
    }

    String get(String keyword) {
        return entries.get(keyword);
    }

    Map<String, String> asMap() {
        return new LinkedHashMap<>(entries);
    }
}
