package org.headwater.harvest;

/** Hears how far a harvest has got; the CLI draws a bar with it. */
public interface HarvestProgress {
    /** Called after each file with the number of files looked at so far. */
    void filesSeen(int count);

    /** Called once when the harvest has finished. */
    void finished();

    /** A listener that does nothing. */
    HarvestProgress NONE = new HarvestProgress() {
        @Override
        public void filesSeen(int count) {
        }

        @Override
        public void finished() {
        }
    };
}
