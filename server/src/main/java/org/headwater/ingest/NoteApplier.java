package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET_NOTE;

import java.util.Objects;
import java.util.TreeSet;
import org.headwater.ingest.Observation.NoteSet;
import org.headwater.store.schema.tables.records.DatasetNoteRecord;

/** Applies descriptions and tags that people write, keeping every earlier wording. */
final class NoteApplier {

    void apply(Tx tx, NoteSet note) {
        Long id = DatasetApplier.find(tx, note.uri());
        if (id == null) {
            throw new UnknownDatasetException(note.uri());
        }
        String tags = Json.stringArray(new TreeSet<>(note.tags()));
        DatasetNoteRecord current = tx.db.selectFrom(DATASET_NOTE)
                .where(DATASET_NOTE.DATASET_ID.eq(id), DATASET_NOTE.VALID_TO.isNull())
                .fetchOne();
        if (current != null && Objects.equals(current.getDescription(), note.description())
                && current.getTags().equals(tags)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(DATASET_NOTE)
                .set(DATASET_NOTE.DATASET_ID, id)
                .set(DATASET_NOTE.DESCRIPTION, note.description())
                .set(DATASET_NOTE.TAGS, tags)
                .set(DATASET_NOTE.AUTHOR, note.author())
                .set(DATASET_NOTE.VALID_FROM, tx.now)
                .execute();
        tx.changed(Change.DATASET, id, "note", "by " + note.author());
    }
}
