package org.headwater.harvest;

import java.io.IOException;

/** A harvest that could not run to its end; its harvest record says failed, with this message. */
public final class HarvestFailedException extends IOException {
    private final long harvestId;

    HarvestFailedException(long harvestId, Throwable cause) {
        super(String.valueOf(cause.getMessage()), cause);
        this.harvestId = harvestId;
    }

    /** The harvest record that holds the failure. */
    public long harvestId() {
        return harvestId;
    }
}
