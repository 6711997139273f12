package org.headwater.harvest.format;

import java.util.Locale;

/**
 * The bytes a reader gets of one file: its beginning, and whether that is the whole file.
 *
 * @param fileName the file's own name, for readers that use the extension as a hint
 * @param head the first bytes of the file (all of it when {@code complete})
 * @param complete true when {@code head} holds the whole file
 * @param size the file's full size in bytes
 */
public record Sample(String fileName, byte[] head, boolean complete, long size) {

    /** The lower-case extension without the dot, or an empty string. */
    public String extension() {
        int dot = fileName.lastIndexOf('.');
        return dot < 0 ? "" : fileName.substring(dot + 1).toLowerCase(Locale.ROOT);
    }
}
