package org.headwater.harvest.format;

/** A file's content could not be read as its format; the message says what was wrong and where. */
public final class UnreadableFileException extends Exception {
    private final String kind;

    /**
     * @param kind a short stable word for the harvest summary: {@code invalid} (the bytes break the format),
     *     {@code truncated} (the file ends early), {@code binary} (binary where text was expected),
     *     {@code too_large} (over a reader's stated size cap), {@code unreadable} (the rest of the file, asked
     *     for through the sample's tail reader, could not be read)
     */
    public UnreadableFileException(String kind, String message) {
        super(message);
        this.kind = kind;
    }

    public String kind() {
        return kind;
    }
}
