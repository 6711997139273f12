package org.headwater.lineage;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** Interns strings (column names, run ids) to small ints; a name repeats across many datasets and edges. */
final class Names {
    private final Map<String, Integer> ids = new HashMap<>();
    private final List<String> names = new ArrayList<>();

    int intern(String name) {
        Integer id = ids.get(name);
        if (id != null) {
            return id;
        }
        int next = names.size();
        names.add(name);
        ids.put(name, next);
        return next;
    }

    /** The id of a name already interned, or -1. */
    int find(String name) {
        Integer id = ids.get(name);
        return id == null ? -1 : id;
    }

    String name(int id) {
        return names.get(id);
    }
}
