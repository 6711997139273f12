package org.headwater.lineage;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.RUN_IO;
import static org.headwater.store.schema.Tables.SCRIPT;

import com.fasterxml.jackson.annotation.JsonRawValue;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.store.Store;
import org.jooq.DSLContext;
import org.jooq.Record;

/**
 * Answers "where did this come from?" for a file or a dataset: the scripts and runs that produced it,
 * the inputs they read (with the content hash each had at the time), and so on upstream. A file is
 * recognised by the run id stamped into it, then by its content hash, then by its path; producers seen
 * at run time come before producers found in code, the most recent run first.
 */
public final class Whence {
    /** How far upstream the chain goes; deep enough for real pipelines, bounded for cycles and giants. */
    static final int MAX_DEPTH = 8;

    private final DSLContext db;

    public Whence(Store store) {
        this.db = store.dsl();
    }

    /** A run as whence shows it. */
    public record RunView(String id, Instant startedAt, Instant endedAt, String user, String host, String gitCommit,
            @JsonRawValue String args, Integer exitCode, String exception) {
    }

    /** An input a producer read, with its content hash then (runs) or now (code). */
    public record Input(String dataset, String hash) {
    }

    /**
     * One way the target came to be.
     *
     * @param script the script's workspace-relative name, or its path when no harvest has seen it
     * @param run the run that wrote it, or null for a producer found only in code
     * @param evidence {@code runtime}, {@code static}, {@code declared} or {@code inferred}
     * @param matchedBy how the target was tied to this producer: {@code stamp}, {@code content} or {@code path}
     */
    public record Producer(String script, RunView run, String evidence, String matchedBy, List<Input> inputs) {
    }

    /** The producers of one dataset upstream of the target. */
    public record Step(String dataset, int distance, List<Producer> producers) {
    }

    /** The whole answer. */
    public record Answer(String target, String sha256, String stamp, List<String> datasets, List<Producer> producers,
            List<Step> upstream) {
    }

    /**
     * Where a file came from.
     *
     * @param uri the file's {@code file:} URI, or null when only its bytes are known
     * @param sha256 its content hash, or null
     * @param stamp the run id stamped into it, or null
     */
    public Answer of(String target, String uri, String sha256, String stamp) {
        Set<Long> datasets = new LinkedHashSet<>();
        if (uri != null) {
            db.select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(uri)).fetch(DATASET.ID).forEach(datasets::add);
        }
        if (sha256 != null) {
            db.select(DATASET_STATE.DATASET_ID).from(DATASET_STATE)
                    .where(DATASET_STATE.CONTENT_HASH.eq(sha256), DATASET_STATE.VALID_TO.isNull())
                    .fetch(DATASET_STATE.DATASET_ID).forEach(datasets::add);
        }
        List<Producer> producers = producers(datasets, sha256, stamp);
        List<Step> upstream = upstream(producers, datasets);
        return new Answer(target, sha256, stamp, names(datasets), producers, upstream);
    }

    /** Where a dataset of the catalog came from. */
    public Answer ofDataset(long datasetId) {
        String name = db.select(DATASET.NAME).from(DATASET).where(DATASET.ID.eq(datasetId)).fetchOne(DATASET.NAME);
        List<Producer> producers = producers(Set.of(datasetId), null, null);
        return new Answer(name, null, null, names(Set.of(datasetId)), producers, upstream(producers, Set.of(datasetId)));
    }

    private List<Producer> producers(Collection<Long> datasets, String sha256, String stamp) {
        Map<String, Producer> byRun = new LinkedHashMap<>();
        if (stamp != null) {
            runsWhere(RUN.ID.eq(stamp)).forEach(r -> byRun.putIfAbsent(r.id(), producer(r, "stamp")));
        }
        if (sha256 != null) {
            runsWhere(RUN.ID.in(db.select(RUN_IO.RUN_ID).from(RUN_IO)
                    .where(RUN_IO.DIRECTION.in("write", "rename_to"), RUN_IO.CONTENT_HASH.eq(sha256))))
                    .forEach(r -> byRun.putIfAbsent(r.id(), producer(r, "content")));
        }
        if (!datasets.isEmpty()) {
            runsWhere(RUN.ID.in(db.select(RUN_IO.RUN_ID).from(RUN_IO)
                    .where(RUN_IO.DIRECTION.in("write", "rename_to"), RUN_IO.DATASET_ID.in(datasets))))
                    .forEach(r -> byRun.putIfAbsent(r.id(), producer(r, "path")));
        }
        List<Producer> all = new ArrayList<>(byRun.values());
        all.addAll(fromCode(datasets));
        return all;
    }

    /** Runs matching a condition, newest first. */
    private List<RunView> runsWhere(org.jooq.Condition condition) {
        return db.selectFrom(RUN).where(condition).orderBy(RUN.STARTED_AT.desc()).limit(50)
                .fetch(r -> new RunView(r.getId(), instant(r.getStartedAt()), instant(r.getEndedAt()), r.getUserName(),
                        r.getHost(), r.getGitCommit(), r.getArguments(), r.getExitCode(), r.getException()));
    }

    private Producer producer(RunView run, String matchedBy) {
        Record script = db.select(SCRIPT.NAME, RUN.SCRIPT_URI).from(RUN).leftJoin(SCRIPT).on(SCRIPT.ID.eq(RUN.SCRIPT_ID))
                .where(RUN.ID.eq(run.id())).fetchOne();
        String name = script.get(SCRIPT.NAME) != null ? script.get(SCRIPT.NAME)
                : script.get(RUN.SCRIPT_URI).replaceFirst("^file://", "");
        List<Input> inputs = db.select(DATASET.NAME, RUN_IO.CONTENT_HASH).from(RUN_IO).join(DATASET).on(DATASET.ID.eq(RUN_IO.DATASET_ID))
                .where(RUN_IO.RUN_ID.eq(run.id()), RUN_IO.DIRECTION.eq("read"))
                .orderBy(RUN_IO.ID)
                .fetch(r -> new Input(r.value1(), r.value2()));
        return new Producer(name, run, "runtime", matchedBy, inputs);
    }

    /** Producers found in code (or declared): current non-runtime edges into the datasets, per script. */
    private List<Producer> fromCode(Collection<Long> datasets) {
        if (datasets.isEmpty()) {
            return List.of();
        }
        var source = DATASET.as("source_dataset");
        var sourceState = DATASET_STATE.as("source_state");
        Map<String, List<Input>> inputs = new LinkedHashMap<>();
        Map<String, String> evidence = new LinkedHashMap<>();
        db.select(SCRIPT.NAME, LINEAGE_EDGE.EVIDENCE, source.NAME, sourceState.CONTENT_HASH, LINEAGE_EDGE.CONFIDENCE)
                .from(LINEAGE_EDGE)
                .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                .leftJoin(sourceState).on(sourceState.DATASET_ID.eq(source.ID), sourceState.VALID_TO.isNull())
                .leftJoin(SCRIPT).on(SCRIPT.ID.eq(LINEAGE_EDGE.SCRIPT_ID))
                .where(LINEAGE_EDGE.TARGET_DATASET_ID.in(datasets), LINEAGE_EDGE.VALID_TO.isNull(),
                        LINEAGE_EDGE.EVIDENCE.ne("runtime"))
                .orderBy(LINEAGE_EDGE.CONFIDENCE.desc(), SCRIPT.NAME, source.NAME)
                .forEach(r -> {
                    String script = r.value1() == null ? "(no script)" : r.value1();
                    evidence.putIfAbsent(script, r.value2());
                    inputs.computeIfAbsent(script, k -> new ArrayList<>()).add(new Input(r.value3(), r.value4()));
                });
        List<Producer> out = new ArrayList<>();
        inputs.forEach((script, in) -> out.add(new Producer(script, null, evidence.get(script), "path", in)));
        return out;
    }

    private List<Step> upstream(List<Producer> producers, Collection<Long> start) {
        List<Step> steps = new ArrayList<>();
        Set<String> visited = new HashSet<>(names(start));
        List<Input> frontier = new ArrayList<>();
        producers.forEach(p -> frontier.addAll(p.inputs()));
        for (int distance = 1; distance <= MAX_DEPTH && !frontier.isEmpty(); distance++) {
            List<Input> next = new ArrayList<>();
            for (Input input : frontier) {
                if (!visited.add(input.dataset())) {
                    continue;
                }
                Set<Long> ids = new LinkedHashSet<>(db.select(DATASET.ID).from(DATASET).where(DATASET.NAME.eq(input.dataset()))
                        .fetch(DATASET.ID));
                List<Producer> found = producers(ids, input.hash(), null);
                if (!found.isEmpty()) {
                    steps.add(new Step(input.dataset(), distance, found));
                    found.forEach(p -> next.addAll(p.inputs()));
                }
            }
            frontier.clear();
            frontier.addAll(next);
        }
        return steps;
    }

    private List<String> names(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        return db.select(DATASET.NAME).from(DATASET).where(DATASET.ID.in(ids)).orderBy(DATASET.NAME).fetch(DATASET.NAME);
    }

    private static Instant instant(java.time.OffsetDateTime t) {
        return t == null ? null : t.toInstant();
    }


}
