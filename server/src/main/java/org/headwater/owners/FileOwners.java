package org.headwater.owners;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.OwnerAssigned;
import org.headwater.ingest.Observation.OwnerRemoved;
import org.headwater.store.OwnerReader.Assigned;

/**
 * Turns the owners file into observations for the datasets of one source: the owners its winning rule
 * names (with the line as the reason), and the end of file-given ownerships no rule gives any more.
 * A dataset that has an owner assigned by hand keeps only its hand-made owners: people win over the file.
 */
public final class FileOwners {
    private FileOwners() {
    }

    /**
     * @param datasets the present datasets of the source: URI to workspace-relative name
     * @param current the current ownerships of those datasets, by URI
     */
    public static List<Observation> observe(OwnersFile file, Map<String, String> datasets,
            Map<String, List<Assigned>> current) {
        List<Observation> out = new ArrayList<>();
        for (Map.Entry<String, String> dataset : new java.util.TreeMap<>(datasets).entrySet()) {
            String uri = dataset.getKey();
            List<Assigned> now = current.getOrDefault(uri, List.of());
            boolean byHand = now.stream().anyMatch(a -> a.origin().equals(OwnerAssigned.MANUAL));
            Set<String> wanted = new HashSet<>();
            Optional<OwnersFile.Match> match = byHand ? Optional.empty() : file.match(dataset.getValue());
            if (match.isPresent()) {
                for (OwnersFile.Owner owner : match.get().rule().owners()) {
                    boolean other = now.stream().anyMatch(a -> a.owner().equals(owner.name())
                            && !a.origin().equals(OwnerAssigned.FILE));
                    if (other) {
                        continue; // given by someone else; the file does not take it over
                    }
                    wanted.add(owner.name());
                    out.add(new OwnerAssigned(uri, owner.name(), owner.kind(), match.get().reason(), OwnerAssigned.FILE,
                            match.get().inherited()));
                }
            }
            for (Assigned a : now) {
                if (a.origin().equals(OwnerAssigned.FILE) && !wanted.contains(a.owner())) {
                    out.add(new OwnerRemoved(uri, a.owner()));
                }
            }
        }
        return out;
    }
}
