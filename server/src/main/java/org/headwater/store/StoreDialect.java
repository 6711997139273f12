package org.headwater.store;

import org.jooq.SQLDialect;

/** The databases a catalog can live in, told apart by the JDBC URL. */
public enum StoreDialect {
    H2(SQLDialect.H2, "jdbc:h2:", "h2"),
    POSTGRESQL(SQLDialect.POSTGRES, "jdbc:postgresql:", "postgresql");

    private final SQLDialect jooq;
    private final String urlPrefix;
    private final String migrationFolder;

    StoreDialect(SQLDialect jooq, String urlPrefix, String migrationFolder) {
        this.jooq = jooq;
        this.urlPrefix = urlPrefix;
        this.migrationFolder = migrationFolder;
    }

    /** The dialect of a JDBC URL; anything else is refused with the URLs that work. */
    public static StoreDialect of(String jdbcUrl) {
        for (StoreDialect d : values()) {
            if (jdbcUrl.startsWith(d.urlPrefix)) {
                return d;
            }
        }
        throw new StoreException("Unsupported store URL " + jdbcUrl.replaceAll("\\?.*", "")
                + ": use jdbc:h2:file:PATH (embedded) or jdbc:postgresql://HOST:PORT/DATABASE (team store)");
    }

    SQLDialect jooq() {
        return jooq;
    }

    /**
     * Where Flyway finds the migrations: the portable folder, then this database's own folder for the few
     * that cannot be written portably. Each dialect folder holds the same versions (one may be a no-op), so
     * that {@link Store#LATEST_MIGRATION} holds for every database.
     */
    String[] migrationLocations() {
        return new String[] {"classpath:db/migration", "classpath:db/" + migrationFolder};
    }

    /** The name of this database's own migration folder under {@code db/}. */
    String migrationFolder() {
        return migrationFolder;
    }
}
