package org.headwater.ingest;

import java.time.Clock;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.EdgeGone;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.NoteSet;
import org.headwater.ingest.Observation.OwnerAssigned;
import org.headwater.ingest.Observation.OwnerRemoved;
import org.headwater.ingest.Observation.ScriptGone;
import org.headwater.ingest.Observation.ScriptSeen;
import org.headwater.store.Store;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The one component that writes catalog facts. A batch of observations is applied in a single
 * transaction: all of it or none of it. Listeners hear about a batch only after it committed.
 */
public final class Ingestor {
    private static final Logger LOG = LoggerFactory.getLogger(Ingestor.class);

    private final Store store;
    private final Clock clock;
    private final List<ChangeListener> listeners = new CopyOnWriteArrayList<>();
    private final DatasetApplier datasets = new DatasetApplier();
    private final ScriptApplier scripts = new ScriptApplier();
    private final EdgeApplier edges = new EdgeApplier();
    private final NoteApplier notes = new NoteApplier();
    private final OwnerApplier owners = new OwnerApplier();
    private final PartitionApplier partitions = new PartitionApplier();
    private final RunApplier runs = new RunApplier(edges);
    private final ReferenceApplier references = new ReferenceApplier();
    private final FreshnessApplier freshness = new FreshnessApplier();
    private final TableVersionApplier tableVersions = new TableVersionApplier();

    public Ingestor(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    public void addListener(ChangeListener listener) {
        listeners.add(listener);
    }

    /**
     * Applies a batch. Batches are serialised: two writers never interleave inside the catalog, which
     * keeps "compare with the current row, then close it" free of races. Within a process this method is
     * synchronised; on a shared store {@link Store#lockForWriting} also makes other processes wait.
     *
     * @param origin who sent the batch, for the change log (for example {@code harvest:12} or {@code api})
     * @return the changes the batch made; empty when everything was already known
     */
    public synchronized List<Change> apply(String origin, List<? extends Observation> batch) {
        if (batch.isEmpty()) {
            return List.of();
        }
        List<Change> changes = store.dsl().transactionResult(configuration -> {
            store.lockForWriting(configuration.dsl());
            // Taken once the lock is held, so that a batch that waited for another process's batch is
            // also later in time than it. Microseconds: PostgreSQL keeps no finer timestamps.
            OffsetDateTime now = OffsetDateTime.ofInstant(clock.instant().truncatedTo(ChronoUnit.MICROS),
                    ZoneOffset.UTC);
            Tx tx = new Tx(configuration.dsl(), now, origin);
            for (int from = 0; from < batch.size(); ) {
                int to = from;
                while (to < batch.size() && BatchRows.covers(batch.get(to))) {
                    to++;
                }
                if (to == from) {
                    dispatch(tx, batch.get(from++));
                    continue;
                }
                // A run of dataset and partition observations reads its rows at once and writes them at once;
                // the other appliers, which read those tables themselves, see them written.
                List<? extends Observation> run = batch.subList(from, to);
                tx.rows.load(run);
                for (Observation observation : run) {
                    dispatch(tx, observation);
                }
                tx.rows.flush();
                from = to;
            }
            tx.writeChanges();
            return List.copyOf(tx.changes());
        });
        notifyListeners(changes);
        return changes;
    }

    private void notifyListeners(List<Change> changes) {
        if (!changes.isEmpty()) {
            for (ChangeListener listener : listeners) {
                try {
                    listener.committed(changes);
                } catch (RuntimeException e) {
                    // The store is the truth and already holds the batch; a listener that falls behind
                    // (the index) catches up from the change log at the next start.
                    LOG.warn("A change listener failed; it will catch up from the change log", e);
                }
            }
        }
    }

    /**
     * Hands changes that another process committed to this process's listeners. It holds the same monitor
     * as {@link #apply}, so a listener never applies an older re-read after a newer one.
     */
    public synchronized void deliver(List<Change> changes) {
        notifyListeners(changes);
    }

    // Java 17 has no pattern switch; the sealed interface still makes a forgotten kind a visible gap here.
    private void dispatch(Tx tx, Observation observation) {
        if (observation instanceof DatasetSeen o) {
            datasets.apply(tx, o);
        } else if (observation instanceof DatasetGone o) {
            datasets.apply(tx, o);
        } else if (observation instanceof Observation.PartitionSeen o) {
            partitions.apply(tx, o);
        } else if (observation instanceof Observation.PartitionGone o) {
            partitions.apply(tx, o);
        } else if (observation instanceof ScriptSeen o) {
            scripts.apply(tx, o);
        } else if (observation instanceof ScriptGone o) {
            scripts.apply(tx, o);
        } else if (observation instanceof EdgeSeen o) {
            edges.apply(tx, o);
        } else if (observation instanceof EdgeGone o) {
            edges.apply(tx, o);
        } else if (observation instanceof Observation.ScriptReferencesSeen o) {
            references.apply(tx, o);
        } else if (observation instanceof Observation.RunReported o) {
            runs.apply(tx, o);
        } else if (observation instanceof NoteSet o) {
            notes.apply(tx, o);
        } else if (observation instanceof OwnerAssigned o) {
            owners.apply(tx, o);
        } else if (observation instanceof OwnerRemoved o) {
            owners.apply(tx, o);
        } else if (observation instanceof Observation.FreshnessPolicySet o) {
            freshness.apply(tx, o);
        } else if (observation instanceof Observation.FreshnessPolicyRemoved o) {
            freshness.apply(tx, o);
        } else if (observation instanceof Observation.FreshnessChecked o) {
            freshness.apply(tx, o);
        } else if (observation instanceof Observation.TableVersionsSeen o) {
            tableVersions.apply(tx, o);
        } else {
            throw new IllegalArgumentException("No applier for " + observation.getClass().getSimpleName());
        }
    }
}
