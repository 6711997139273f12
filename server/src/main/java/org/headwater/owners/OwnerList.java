package org.headwater.owners;

import java.util.List;
import org.headwater.lineage.Target;
import org.headwater.store.OwnerReader;
import org.headwater.store.Views.OwnerView;

/**
 * Whom to ask about a dataset, or about one partition of a partitioned set: a partition has no owners of
 * its own, it has its set's, marked inherited and with the set named in the reason.
 */
public record OwnerList(String dataset, List<OwnerView> owners) {

    public static List<OwnerView> of(OwnerReader reader, Target target) {
        return of(reader, target, null);
    }

    /** The owners as they were at {@code asOf} (now when null). */
    public static List<OwnerView> of(OwnerReader reader, Target target, java.time.Instant asOf) {
        List<OwnerView> owners = reader.ownersOf(target.datasetId(), asOf);
        if (target.partition() == null) {
            return owners;
        }
        return owners.stream().map(o -> new OwnerView(o.name(), o.kind(),
                "owner of the partitioned set " + target.dataset() + ": " + o.reason(), o.origin(), true,
                o.suggested())).toList();
    }
}
