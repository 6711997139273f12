package org.headwater.harvest;

import java.util.List;
import java.util.Map;
import org.headwater.store.Views.HarvestErrorView;

/**
 * What one harvest did.
 *
 * @param filesUnchanged files skipped because their size and modification time were as last seen
 * @param filesIgnored hidden files, symbolic links and special files, which are never harvested
 * @param errorsByKind number of unreadable files by kind of problem
 */
public record HarvestSummary(long harvestId, String source, String root, String status, int filesSeen,
        int filesUnchanged, int filesIgnored, int datasets, int scripts, int changes, int removed, int errors,
        Map<String, Integer> errorsByKind, List<HarvestErrorView> firstErrors, long elapsedMillis) {
}
