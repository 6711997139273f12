package org.headwater.harvest.jdbc;

import java.util.List;
import java.util.Objects;

/**
 * A database to harvest, as the sources configuration describes it. (The JDBC harvester's branch defines
 * the same record; at merge its version, with the same components, replaces this one.)
 *
 * @param passwordEnv the name of the environment variable holding the password (never the password itself),
 *     or null for none
 * @param include globs over {@code schema.table}; empty means everything
 * @param exclude globs over {@code schema.table} left out even when included
 * @param sampling whether cell values may be sampled
 */
public record DatabaseSource(String name, String jdbcUrl, String user, String passwordEnv, List<String> include,
        List<String> exclude, boolean sampling) {
    public DatabaseSource {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(jdbcUrl, "jdbcUrl");
        include = include == null ? List.of() : List.copyOf(include);
        exclude = exclude == null ? List.of() : List.copyOf(exclude);
    }
}
