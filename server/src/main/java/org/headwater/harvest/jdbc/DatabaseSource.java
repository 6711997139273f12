package org.headwater.harvest.jdbc;

import java.util.List;
import java.util.Objects;

/**
 * A database to harvest, as the sources configuration or the command line describes it.
 *
 * @param user the user to log in as, or null to let the driver or URL decide
 * @param passwordEnv the name of the environment variable holding the password (never the password itself),
 *     or null for none
 * @param include globs over {@code schema.table} (case-insensitive); empty means everything
 * @param exclude globs over {@code schema.table} left out even when included
 * @param sampling whether cell values may be sampled; the JDBC harvester reads none in this version
 * @param ownersFile an owners file whose rules name tables as {@code schema/table} (a schema is a folder),
 *     or null for none
 */
public record DatabaseSource(String name, String jdbcUrl, String user, String passwordEnv, List<String> include,
        List<String> exclude, boolean sampling, java.nio.file.Path ownersFile) {
    public DatabaseSource {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(jdbcUrl, "jdbcUrl");
        include = include == null ? List.of() : List.copyOf(include);
        exclude = exclude == null ? List.of() : List.copyOf(exclude);
    }

    /** A source without an owners file. */
    public DatabaseSource(String name, String jdbcUrl, String user, String passwordEnv, List<String> include,
            List<String> exclude, boolean sampling) {
        this(name, jdbcUrl, user, passwordEnv, include, exclude, sampling, null);
    }

    /** A source with no globs and no sampling. */
    public static DatabaseSource of(String name, String jdbcUrl, String user, String passwordEnv) {
        return new DatabaseSource(name, jdbcUrl, user, passwordEnv, List.of(), List.of(), false);
    }

    /** A name for a source given only by its URL: the database's name, the last part of the URL's path. */
    public static String defaultName(String jdbcUrl) {
        String path = Secrets.safeUrl(jdbcUrl).replaceFirst("[?;].*$", "");
        String last = path.substring(Math.max(path.lastIndexOf('/'), path.lastIndexOf(':')) + 1);
        return last.isBlank() ? "database" : last;
    }

    /** The JDBC URL without user information or password-like settings: safe to store and show. */
    public String safeUrl() {
        return Secrets.safeUrl(jdbcUrl);
    }

    @Override
    public String toString() {
        // The URL may carry credentials; the record's printed form must not.
        return "DatabaseSource[" + name + ", " + Secrets.safeUrl(jdbcUrl) + "]";
    }
}
