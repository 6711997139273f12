package org.headwater.analysis.script.lineage;

/** A dataset column a frame column comes from; {@code derived} when computed rather than copied. */
public record Origin(String source, String column, boolean derived) {
    public Origin asDerived() {
        return derived ? this : new Origin(source, column, true);
    }
}
