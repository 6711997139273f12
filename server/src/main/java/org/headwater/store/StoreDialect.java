package org.headwater.store;

import org.jooq.SQLDialect;

/** The databases a catalog can live in, told apart by the JDBC URL. */
public enum StoreDialect {
    H2(SQLDialect.H2, "jdbc:h2:"),
    POSTGRESQL(SQLDialect.POSTGRES, "jdbc:postgresql:");

    private final SQLDialect jooq;
    private final String urlPrefix;

    StoreDialect(SQLDialect jooq, String urlPrefix) {
        this.jooq = jooq;
        this.urlPrefix = urlPrefix;
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
     * Where Flyway finds the migrations: one portable folder for every database. A migration that truly
     * cannot be written portably would go in an extra folder per dialect, listed here.
     */
    String[] migrationLocations() {
        return new String[] {"classpath:db/migration"};
    }
}
