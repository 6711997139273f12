package org.headwater.store;

import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import org.jooq.Condition;
import org.jooq.Field;

/** The one rule for reading history: which rows were in force at a given time. */
public final class Validity {
    private Validity() {
    }

    /** Rows current now ({@code asOf} null) or in force at {@code asOf}. */
    public static Condition at(Field<OffsetDateTime> validFrom, Field<OffsetDateTime> validTo, Instant asOf) {
        if (asOf == null) {
            return validTo.isNull();
        }
        OffsetDateTime t = OffsetDateTime.ofInstant(asOf, ZoneOffset.UTC);
        return validFrom.le(t).and(validTo.isNull().or(validTo.gt(t)));
    }

    static Instant instant(OffsetDateTime time) {
        return time == null ? null : time.toInstant();
    }
}
