package org.headwater.harvest.format;

/** A file's content could not be read as its format; the message says what was wrong and where. */
public final class UnreadableFileException extends Exception {
    private final String kind;

    /**
     * @param kind a short stable word for the harvest summary: {@code invalid}, {@code truncated}, {@code binary}
     */
    public UnreadableFileException(String kind, String message) {
        super(message);
        this.kind = kind;
    }

    public String kind() {
        return kind;
    }
}
