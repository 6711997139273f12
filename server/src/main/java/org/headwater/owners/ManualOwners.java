package org.headwater.owners;

import java.util.ArrayList;
import java.util.List;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.OwnerAssigned;
import org.headwater.ingest.Observation.OwnerRemoved;
import org.headwater.store.OwnerReader;
import org.headwater.store.OwnerReader.Assigned;

/**
 * Owners assigned by hand, through {@code headwater own} or the API. A hand-made owner replaces the
 * owners file's rules for that dataset (the file's owners of it end in the same batch, and later
 * harvests leave it alone); removing the last hand-made owner lets the file's rules apply again at the
 * next harvest.
 */
public final class ManualOwners {
    private final Ingestor ingestor;
    private final OwnerReader owners;

    public ManualOwners(Ingestor ingestor, OwnerReader owners) {
        this.ingestor = ingestor;
        this.owners = owners;
    }

    /** A request the rules refuse; {@code notFound} when the owner is not an owner of the dataset. */
    public static final class Refused extends RuntimeException {
        private final boolean notFound;

        Refused(String message, boolean notFound) {
            super(message);
            this.notFound = notFound;
        }

        public boolean notFound() {
            return notFound;
        }
    }

    /**
     * Makes {@code owner} an owner of the dataset.
     *
     * @param kind {@code person} or {@code team}
     * @param via who asked, for the reason: {@code command line} or {@code api}
     */
    public void assign(long datasetId, String uri, String owner, String kind, String via) {
        String name = checkName(owner);
        if (!kind.equals("person") && !kind.equals("team")) {
            throw new IllegalArgumentException("kind must be 'person' or 'team', got '" + kind + "'");
        }
        List<Observation> batch = new ArrayList<>();
        batch.add(new OwnerAssigned(uri, name, kind, "assigned by hand (" + via + ")", OwnerAssigned.MANUAL, false));
        for (Assigned a : current(datasetId)) {
            if (a.origin().equals(OwnerAssigned.FILE) && !a.owner().equals(name)) {
                batch.add(new OwnerRemoved(uri, a.owner()));
            }
        }
        ingestor.apply(via.equals("api") ? "api" : "cli", batch);
    }

    /** Ends an ownership given by hand or by another source; one given by the owners file is changed there. */
    public void remove(long datasetId, String uri, String datasetName, String owner, String via) {
        Assigned found = current(datasetId).stream().filter(a -> a.owner().equals(owner)).findFirst()
                .orElseThrow(() -> new Refused(owner + " is not an owner of " + datasetName, true));
        if (found.origin().equals(OwnerAssigned.FILE)) {
            throw new Refused(owner + " owns " + datasetName + " through " + found.reason()
                    + "; change that line, or assign an owner by hand (which replaces the file's rules for this dataset)",
                    false);
        }
        ingestor.apply(via.equals("api") ? "api" : "cli", List.of(new OwnerRemoved(uri, owner)));
    }

    private List<Assigned> current(long datasetId) {
        return owners.assigned(List.of(datasetId), null).getOrDefault(datasetId, List.of());
    }

    private static String checkName(String owner) {
        String name = owner == null ? "" : owner.strip();
        if (name.isEmpty()) {
            throw new IllegalArgumentException("the owner's name is empty");
        }
        if (name.length() > 200) {
            throw new IllegalArgumentException("an owner's name has at most 200 characters");
        }
        if (name.chars().anyMatch(Character::isISOControl)) {
            throw new IllegalArgumentException("an owner's name cannot hold control characters");
        }
        return name;
    }
}
