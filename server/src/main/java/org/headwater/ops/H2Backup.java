package org.headwater.ops;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.stream.Stream;
import java.util.zip.ZipEntry;
import java.util.zip.ZipInputStream;
import org.headwater.store.Store;
import org.headwater.store.StoreDialect;
import org.jooq.impl.DSL;

/**
 * Copies an embedded H2 catalog to a zip file and back, with H2's own tools: the {@code BACKUP TO}
 * statement (H2 docs, Commands: "Backs up the database files to a .zip file. Objects are not locked,
 * but the backup is transactionally consistent") and {@code org.h2.tools.Restore}. The search index is
 * not in the backup: it is derived, and rebuilt from the restored store.
 */
public final class H2Backup {
    /** The H2 database name inside a catalog directory ({@code catalog.mv.db}). */
    static final String DATABASE = "catalog";

    private H2Backup() {
    }

    /** A backup or restore that cannot be done; the message says why. Nothing was changed. */
    public static final class RefusedException extends RuntimeException {
        RefusedException(String message) {
            super(message);
        }
    }

    /** Writes a consistent copy of the store to {@code zip}, refusing to replace a file unless {@code force}. */
    public static void backup(Store store, Path zip, boolean force) throws IOException {
        if (store.dialect() != StoreDialect.H2) {
            throw new RefusedException("backup copies the embedded H2 store; for PostgreSQL use pg_dump (see README)");
        }
        Path target = zip.toAbsolutePath().normalize();
        if (Files.exists(target)) {
            if (!force) {
                throw new RefusedException(target + " exists; pass --force to replace it");
            }
            Files.delete(target);
        }
        Files.createDirectories(target.getParent());
        store.dsl().execute("backup to " + DSL.inline(target.toString()));
    }

    /**
     * Puts the store of {@code zip} into {@code dataDir}, which must hold no catalog unless {@code force};
     * any search index there is removed so that the next open rebuilds it from the restored store.
     */
    public static void restore(Path zip, Path dataDir, boolean force) throws IOException {
        if (!Files.isRegularFile(zip)) {
            throw new RefusedException("no backup file " + zip);
        }
        if (!holdsCatalog(zip)) {
            throw new RefusedException(zip + " is not a Headwater backup (no " + DATABASE + ".mv.db inside)");
        }
        Path dir = dataDir.toAbsolutePath().normalize();
        Path existing = dir.resolve(DATABASE + ".mv.db");
        if (Files.exists(existing) && !force) {
            throw new RefusedException(dir + " already holds a catalog; pass --force to replace it with the backup");
        }
        Files.createDirectories(dir);
        Files.deleteIfExists(existing);
        Files.deleteIfExists(dir.resolve(DATABASE + ".trace.db"));
        deleteTree(dir.resolve("index"));
        org.h2.tools.Restore.execute(zip.toString(), dir.toString(), DATABASE);
    }

    private static boolean holdsCatalog(Path zip) throws IOException {
        try (InputStream in = Files.newInputStream(zip); ZipInputStream entries = new ZipInputStream(in)) {
            for (ZipEntry e = entries.getNextEntry(); e != null; e = entries.getNextEntry()) {
                if (e.getName().equals(DATABASE + ".mv.db")) {
                    return true;
                }
            }
            return false;
        }
    }

    private static void deleteTree(Path dir) throws IOException {
        if (!Files.exists(dir)) {
            return;
        }
        try (Stream<Path> files = Files.walk(dir)) {
            for (Path p : (Iterable<Path>) files.sorted(Comparator.reverseOrder())::iterator) {
                Files.delete(p);
            }
        }
    }
}
