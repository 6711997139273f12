package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/** The warnings of one statement, each said once, in the order found. */
final class Warnings {

    private final Set<String> messages = new LinkedHashSet<>();

    void add(String message) {
        messages.add(message);
    }

    List<String> list() {
        return new ArrayList<>(messages);
    }
}
