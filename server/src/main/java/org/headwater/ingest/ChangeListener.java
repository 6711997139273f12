package org.headwater.ingest;

import java.util.List;

/** Told, after each committed batch, what the batch changed; the search index is one. */
@FunctionalInterface
public interface ChangeListener {
    void committed(List<Change> changes);
}
