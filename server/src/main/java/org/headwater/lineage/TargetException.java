package org.headwater.lineage;

/** A name that does not designate one dataset or column; the message says what to try instead. */
public final class TargetException extends RuntimeException {
    private final boolean notFound;

    TargetException(String message, boolean notFound) {
        super(message);
        this.notFound = notFound;
    }

    /** True when nothing matched (a 404); false when the name was ambiguous or malformed (a 400). */
    public boolean notFound() {
        return notFound;
    }
}
