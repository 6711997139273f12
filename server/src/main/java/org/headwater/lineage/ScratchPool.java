package org.headwater.lineage;

import java.util.ArrayDeque;

/** Lends {@link Scratch}es to concurrent walks; keeps a few idle ones rather than one per thread ever seen. */
final class ScratchPool {
    private static final int MAX_IDLE = 4;

    private final ArrayDeque<Scratch> idle = new ArrayDeque<>();

    Scratch take(int nodes) {
        Scratch scratch;
        synchronized (this) {
            scratch = idle.poll();
        }
        if (scratch == null) {
            scratch = new Scratch();
        }
        scratch.ensure(nodes);
        return scratch;
    }

    void give(Scratch scratch) {
        synchronized (this) {
            if (idle.size() < MAX_IDLE) {
                idle.push(scratch);
            }
        }
    }
}
