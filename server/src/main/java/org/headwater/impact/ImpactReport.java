package org.headwater.impact;

import java.util.List;
import org.headwater.lineage.Step;
import org.headwater.lineage.Target;
import org.headwater.store.Views.OwnerView;

/**
 * What a change affects, nearest first, with counts at the top.
 *
 * @param startInCycle whether the target feeds back into itself (a script that rewrites its own input)
 */
public record ImpactReport(Target target, String change, String title, Counts counts, boolean startInCycle,
        List<Affected> affected) {

    /** How many of each kind are affected, and how many distinct owners to tell. */
    public record Counts(int total, int datasets, int columns, int scripts, int figures, int views, int indirect,
            int uncertain, int owners) {
    }

    /**
     * One affected thing.
     *
     * @param name a dataset's or script's name, or {@code dataset.column}
     * @param kind {@code dataset}, {@code column}, {@code script}, {@code figure} or {@code view}
     * @param id the dataset's id (for a column, its dataset's) or the script's id
     * @param distance hops from the target along the path
     * @param indirect reached only through columns that filter, join or group (it decides which rows
     *     there are, not their values)
     * @param uncertain reached through a script whose use of columns is not known
     * @param why what the change does to it, in a sentence
     * @param owners whom to tell: its owners, or suggested people when it has none
     * @param path the evidence chain from the target, hop by hop
     */
    public record Affected(String name, String kind, long id, int distance, boolean indirect, boolean uncertain,
            String why, List<OwnerView> owners, List<Step> path) {
    }
}
