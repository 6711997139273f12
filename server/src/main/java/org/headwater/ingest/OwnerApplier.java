package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.OWNER;

import org.headwater.ingest.Observation.OwnerAssigned;
import org.headwater.ingest.Observation.OwnerRemoved;
import org.headwater.store.schema.tables.records.DatasetOwnerRecord;

/** Applies who owns a dataset and why, keeping earlier ownership. */
final class OwnerApplier {

    void apply(Tx tx, OwnerAssigned assigned) {
        long dataset = requireDataset(tx, assigned.uri());
        Long owner = tx.db.select(OWNER.ID).from(OWNER).where(OWNER.NAME.eq(assigned.owner())).fetchOne(OWNER.ID);
        if (owner == null) {
            owner = tx.db.insertInto(OWNER).set(OWNER.NAME, assigned.owner()).set(OWNER.KIND, assigned.ownerKind())
                    .returningResult(OWNER.ID).fetchOne(OWNER.ID);
        }
        DatasetOwnerRecord current = current(tx, dataset, owner);
        if (current != null && current.getReason().equals(assigned.reason())
                && current.getOrigin().equals(assigned.origin()) && current.getInherited() == assigned.inherited()) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(DATASET_OWNER)
                .set(DATASET_OWNER.DATASET_ID, dataset)
                .set(DATASET_OWNER.OWNER_ID, owner)
                .set(DATASET_OWNER.REASON, assigned.reason())
                .set(DATASET_OWNER.ORIGIN, assigned.origin())
                .set(DATASET_OWNER.INHERITED, assigned.inherited())
                .set(DATASET_OWNER.VALID_FROM, tx.now)
                .execute();
        tx.changed(Change.DATASET, dataset, "owner", assigned.owner());
    }

    void apply(Tx tx, OwnerRemoved removed) {
        long dataset = requireDataset(tx, removed.uri());
        Long owner = tx.db.select(OWNER.ID).from(OWNER).where(OWNER.NAME.eq(removed.owner())).fetchOne(OWNER.ID);
        DatasetOwnerRecord current = owner == null ? null : current(tx, dataset, owner);
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
            tx.changed(Change.DATASET, dataset, "owner", "removed " + removed.owner());
        }
    }

    private static DatasetOwnerRecord current(Tx tx, long dataset, long owner) {
        return tx.db.selectFrom(DATASET_OWNER)
                .where(DATASET_OWNER.DATASET_ID.eq(dataset), DATASET_OWNER.OWNER_ID.eq(owner),
                        DATASET_OWNER.VALID_TO.isNull())
                .fetchOne();
    }

    private static long requireDataset(Tx tx, String uri) {
        Long id = DatasetApplier.find(tx, uri);
        if (id == null) {
            throw new UnknownDatasetException(uri);
        }
        return id;
    }
}
