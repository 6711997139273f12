package org.headwater.testing;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;

/** A clock that moves one second forward each time it is read, so that history rows have distinct times. */
public final class SteppingClock extends Clock {
    private Instant next;

    public SteppingClock(Instant start) {
        this.next = start;
    }

    @Override
    public synchronized Instant instant() {
        Instant now = next;
        next = next.plus(Duration.ofSeconds(1));
        return now;
    }

    /** A moment after the last reading and before the next one: "between two changes". */
    public synchronized Instant between() {
        return next.minusMillis(500);
    }

    @Override
    public ZoneId getZone() {
        return ZoneOffset.UTC;
    }

    @Override
    public Clock withZone(ZoneId zone) {
        return this;
    }
}
