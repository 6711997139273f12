package org.headwater.ingest;

import java.time.Instant;

/**
 * One step of a harvest as it happens, for live status: {@code started}, {@code progress} (counts so far),
 * {@code problem} (a file or table that could not be read, or a link or special file refused; not named
 * "error", which an EventSource uses for its own connection failures), {@code finished} (the outcome and final counts;
 * sent again when errors found after the files, such as a bad policy file, change the outcome).
 * Fields that a type does not use are null. No field carries a source's address or settings.
 */
public record HarvestEvent(String type, long harvestId, String source, Instant at, Integer filesSeen, Integer errors,
        String status, HarvestJournal.Counts counts, String uri, String kind, String message) {
    public static final String STARTED = "started";
    public static final String PROGRESS = "progress";
    public static final String PROBLEM = "problem";
    public static final String FINISHED = "finished";
}
