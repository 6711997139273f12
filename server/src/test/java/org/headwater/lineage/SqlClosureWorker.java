package org.headwater.lineage;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Path;
import java.sql.SQLException;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;
import org.jooq.DSLContext;

/**
 * Not a test: the benchmark's SQL side, run in a child JVM with a small heap so that a recursive query that
 * runs out of memory ends this process, not the benchmark. Prints one line per attempt:
 * {@code ok <wall ms> <cpu ms> <rows>}, {@code timeout <wall ms>} or {@code oom <wall ms>}. Embedded H2 runs
 * the query on the calling thread, so that thread's CPU time is the query's.
 *
 * <p>Arguments: catalog directory, start dataset id, repetitions, timeout in seconds, time budget in seconds.
 */
public final class SqlClosureWorker {
    /**
     * The dataset-level downstream closure as one recursive query. {@code UNION} (not {@code UNION ALL})
     * so that the recursion may drop rows it has already produced instead of one row per path.
     */
    static final String CLOSURE = """
            with recursive reach(id) as (
                select target_dataset_id from lineage_edge where source_dataset_id = ? and valid_to is null
                union
                select e.target_dataset_id from lineage_edge e join reach r on e.source_dataset_id = r.id
                where e.valid_to is null
            )
            select count(*) from reach""";

    private static final ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();

    private SqlClosureWorker() {
    }

    public static void main(String[] args) {
        Path dir = Path.of(args[0]);
        long start = Long.parseLong(args[1]);
        int repetitions = Integer.parseInt(args[2]);
        int timeoutSeconds = Integer.parseInt(args[3]);
        long budgetNanos = Long.parseLong(args[4]) * 1_000_000_000L;
        try (Store store = Store.open(StoreConfig.embedded(dir))) {
            DSLContext db = store.dsl();
            long began = System.nanoTime();
            for (int i = 0; i < repetitions && System.nanoTime() - began < budgetNanos; i++) {
                long t0 = System.nanoTime();
                long c0 = THREADS.getCurrentThreadCpuTime();
                try {
                    Integer rows = db.resultQuery(CLOSURE, start).queryTimeout(timeoutSeconds).fetchOne(0, Integer.class);
                    System.out.printf("ok %.3f %.3f %d%n", millis(t0), (THREADS.getCurrentThreadCpuTime() - c0) / 1e6, rows);
                } catch (OutOfMemoryError e) {
                    System.out.printf("oom %.3f%n", millis(t0));
                    System.out.flush();
                    // Nothing else in a JVM that ran out of memory is worth waiting for, closing the store included.
                    Runtime.getRuntime().halt(0);
                } catch (RuntimeException e) {
                    if (sqlState(e, "90108")) {
                        // H2 catches the OutOfMemoryError itself and reports it as error 90108.
                        System.out.printf("oom %.3f%n", millis(t0));
                        System.out.flush();
                        Runtime.getRuntime().halt(0);
                    }
                    if (!sqlState(e, "57014")) {
                        throw e;
                    }
                    System.out.printf("timeout %.3f%n", millis(t0));
                    break;
                }
                System.out.flush();
            }
        }
        System.out.flush();
    }

    private static double millis(long t0) {
        return (System.nanoTime() - t0) / 1e6;
    }

    /** H2 reports a cancelled statement (query timeout) with SQL state 57014, running out of memory with 90108. */
    private static boolean sqlState(Throwable e, String state) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof SQLException sql && state.equals(sql.getSQLState())) {
                return true;
            }
        }
        return false;
    }
}
