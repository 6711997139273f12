package org.headwater.export;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.OWNER;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.RUN_IO;
import static org.headwater.store.schema.Tables.SCRIPT;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.io.OutputStream;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.Query;
import org.headwater.store.Store;
import org.headwater.store.Validity;
import org.jooq.Condition;
import org.jooq.DSLContext;
import org.jooq.impl.DSL;

/**
 * Writes the lineage graph as W3C PROV-O (Recommendation, 30 April 2013) in JSON-LD 1.1: datasets are
 * {@code prov:Entity}, scripts {@code prov:Plan}, runs {@code prov:Activity}, owners and the people who ran
 * scripts {@code prov:Agent}. Every dataset edge becomes one {@code prov:wasDerivedFrom}, qualified with the
 * script, run and evidence that support it; runs carry {@code prov:used}, {@code prov:startedAtTime} and
 * {@code prov:endedAtTime}, and their outputs {@code prov:wasGeneratedBy}.
 */
public final class ProvExport {
    private static final String PROV = "http://www.w3.org/ns/prov#";
    private static final String XSD = "http://www.w3.org/2001/XMLSchema#";
    private static final String RDFS = "http://www.w3.org/2000/01/rdf-schema#";

    private final Store store;

    public ProvExport(Store store) {
        this.store = store;
    }

    /** What an export wrote, for the CLI's summary line. */
    public record Counts(int entities, int derivations, int activities, int plans, int agents) {
    }

    /** Writes the scope's PROV document to {@code out} (not closed). */
    public Counts write(ProvScope scope, OutputStream out) throws IOException {
        DSLContext db = store.dsl();
        Instant asOf = scope.asOf();
        Set<Long> inScope = scope.datasetId() == null ? null : neighbourhood(scope);

        Map<Long, DatasetFacts> datasets = datasets(db, asOf, inScope);
        List<EdgeFacts> edges = edges(db, asOf, datasets.keySet());
        Map<String, RunFacts> runs = runs(db, asOf, datasets.keySet(), edges);
        Set<Long> scriptIds = new TreeSet<>();
        edges.forEach(e -> {
            if (e.scriptId() != null) {
                scriptIds.add(e.scriptId());
            }
        });
        runs.values().forEach(r -> {
            if (r.scriptId() != null) {
                scriptIds.add(r.scriptId());
            }
        });
        Map<Long, String[]> scripts = scripts(db, scriptIds);
        Map<Long, List<String>> owners = owners(db, asOf, datasets.keySet());
        Map<String, String> ownerKinds = ownerKinds(db, owners);
        Set<String> people = new TreeSet<>();
        runs.values().forEach(r -> {
            if (r.user() != null) {
                people.add(r.user());
            }
        });

        try (JsonGenerator g = new JsonFactory().createGenerator(out, JsonEncoding.UTF8)) {
            g.useDefaultPrettyPrinter();
            g.configure(JsonGenerator.Feature.AUTO_CLOSE_TARGET, false);
            g.writeStartObject();
            writeContext(g);
            g.writeArrayFieldStart("@graph");
            Map<Long, List<EdgeFacts>> edgesInto = new TreeMap<>();
            edges.forEach(e -> edgesInto.computeIfAbsent(e.targetId(), k -> new ArrayList<>()).add(e));
            Map<Long, Set<String>> generatedBy = new TreeMap<>();
            runs.forEach((runId, r) -> r.outputs().forEach(d -> generatedBy.computeIfAbsent(d, k -> new TreeSet<>()).add(runId)));
            for (DatasetFacts d : datasets.values()) {
                writeDataset(g, d, edgesInto.getOrDefault(d.id(), List.of()), datasets, scripts, generatedBy.get(d.id()),
                        owners.getOrDefault(d.id(), List.of()));
            }
            for (var s : scripts.entrySet()) {
                g.writeStartObject();
                g.writeStringField("@id", Iris.of(s.getValue()[0]));
                g.writeArrayFieldStart("@type");
                g.writeString("prov:Entity");
                g.writeString("prov:Plan");
                g.writeEndArray();
                g.writeStringField("rdfs:label", s.getValue()[1]);
                g.writeEndObject();
            }
            for (var r : runs.entrySet()) {
                writeRun(g, r.getKey(), r.getValue(), datasets, scripts);
            }
            for (String user : people) {
                g.writeStartObject();
                g.writeStringField("@id", Iris.person(user));
                g.writeArrayFieldStart("@type");
                g.writeString("prov:Agent");
                g.writeString("prov:Person");
                g.writeEndArray();
                g.writeStringField("rdfs:label", user);
                g.writeEndObject();
            }
            for (var o : ownerKinds.entrySet()) {
                g.writeStartObject();
                g.writeStringField("@id", Iris.owner(o.getKey()));
                g.writeArrayFieldStart("@type");
                g.writeString("prov:Agent");
                // PROV-O section 3.1: a person is prov:Person, a team an organization.
                g.writeString("team".equals(o.getValue()) ? "prov:Organization" : "prov:Person");
                g.writeEndArray();
                g.writeStringField("rdfs:label", o.getKey());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
        }
        return new Counts(datasets.size(), edges.size(), runs.size(), scripts.size(), people.size() + ownerKinds.size());
    }

    private static void writeContext(JsonGenerator g) throws IOException {
        // An inline context: a reader never has to fetch anything to expand the document.
        g.writeObjectFieldStart("@context");
        g.writeStringField("prov", PROV);
        g.writeStringField("xsd", XSD);
        g.writeStringField("rdfs", RDFS);
        g.writeStringField("hw", Iris.VOCAB);
        g.writeEndObject();
    }

    private static void writeDataset(JsonGenerator g, DatasetFacts d, List<EdgeFacts> into, Map<Long, DatasetFacts> datasets,
            Map<Long, String[]> scripts, Set<String> generatedBy, List<String> owners) throws IOException {
        g.writeStartObject();
        g.writeStringField("@id", Iris.of(d.uri()));
        g.writeStringField("@type", "prov:Entity");
        g.writeStringField("rdfs:label", d.name());
        g.writeStringField("hw:kind", d.kind());
        if (d.contentHash() != null) {
            g.writeStringField("hw:sha256", d.contentHash());
        }
        Set<String> sources = new TreeSet<>();
        into.forEach(e -> sources.add(Iris.of(datasets.get(e.sourceId()).uri())));
        writeIds(g, "prov:wasDerivedFrom", sources);
        if (!into.isEmpty()) {
            g.writeArrayFieldStart("prov:qualifiedDerivation");
            for (EdgeFacts e : into) {
                g.writeStartObject();
                g.writeStringField("@type", "prov:Derivation");
                writeId(g, "prov:entity", Iris.of(datasets.get(e.sourceId()).uri()));
                if (e.runId() != null) {
                    writeId(g, "prov:hadActivity", Iris.run(e.runId()));
                }
                if (e.scriptId() != null && scripts.containsKey(e.scriptId())) {
                    writeId(g, "hw:viaScript", Iris.of(scripts.get(e.scriptId())[0]));
                }
                g.writeStringField("hw:evidence", e.evidence());
                g.writeNumberField("hw:confidence", e.confidence());
                g.writeEndObject();
            }
            g.writeEndArray();
        }
        if (generatedBy != null) {
            Set<String> runIris = new TreeSet<>();
            generatedBy.forEach(r -> runIris.add(Iris.run(r)));
            writeIds(g, "prov:wasGeneratedBy", runIris);
        }
        Set<String> ownerIris = new TreeSet<>();
        owners.forEach(o -> ownerIris.add(Iris.owner(o)));
        writeIds(g, "prov:wasAttributedTo", ownerIris);
        g.writeEndObject();
    }

    private static void writeRun(JsonGenerator g, String runId, RunFacts r, Map<Long, DatasetFacts> datasets,
            Map<Long, String[]> scripts) throws IOException {
        g.writeStartObject();
        g.writeStringField("@id", Iris.run(runId));
        g.writeStringField("@type", "prov:Activity");
        g.writeStringField("rdfs:label", "run " + runId);
        writeTime(g, "prov:startedAtTime", r.startedAt());
        if (r.endedAt() != null) {
            writeTime(g, "prov:endedAtTime", r.endedAt());
        }
        Set<String> used = new TreeSet<>();
        r.inputs().forEach(d -> used.add(Iris.of(datasets.get(d).uri())));
        writeIds(g, "prov:used", used);
        String plan = r.scriptId() != null && scripts.containsKey(r.scriptId()) ? Iris.of(scripts.get(r.scriptId())[0])
                : r.scriptUri() == null ? null : Iris.of(r.scriptUri());
        if (r.user() != null) {
            writeId(g, "prov:wasAssociatedWith", Iris.person(r.user()));
        }
        if (plan != null) {
            // PROV-O section 3.3: the plan an activity followed hangs off a qualified association.
            g.writeObjectFieldStart("prov:qualifiedAssociation");
            g.writeStringField("@type", "prov:Association");
            if (r.user() != null) {
                writeId(g, "prov:agent", Iris.person(r.user()));
            }
            writeId(g, "prov:hadPlan", plan);
            g.writeEndObject();
        }
        if (r.exitCode() != null) {
            g.writeNumberField("hw:exitCode", r.exitCode());
        }
        g.writeEndObject();
    }

    private static void writeTime(JsonGenerator g, String field, Instant time) throws IOException {
        g.writeObjectFieldStart(field);
        g.writeStringField("@value", time.toString());
        g.writeStringField("@type", "xsd:dateTime");
        g.writeEndObject();
    }

    private static void writeId(JsonGenerator g, String field, String iri) throws IOException {
        g.writeObjectFieldStart(field);
        g.writeStringField("@id", iri);
        g.writeEndObject();
    }

    private static void writeIds(JsonGenerator g, String field, Set<String> iris) throws IOException {
        if (iris.isEmpty()) {
            return;
        }
        g.writeArrayFieldStart(field);
        for (String iri : iris) {
            g.writeStartObject();
            g.writeStringField("@id", iri);
            g.writeEndObject();
        }
        g.writeEndArray();
    }

    private Set<Long> neighbourhood(ProvScope scope) {
        LineageGraph graph = scope.asOf() == null ? LineageGraph.load(store) : LineageGraph.loadAsOf(store, scope.asOf());
        Query query = Query.everything().withMaxDepth(scope.depth());
        Set<Long> ids = new TreeSet<>();
        ids.add(scope.datasetId());
        for (long id : graph.downstream(scope.datasetId(), query).datasetIds()) {
            ids.add(id);
        }
        for (long id : graph.upstream(scope.datasetId(), query).datasetIds()) {
            ids.add(id);
        }
        return ids;
    }

    private record DatasetFacts(long id, String uri, String name, String kind, String contentHash) {
    }

    private record EdgeFacts(long sourceId, long targetId, Long scriptId, String runId, String evidence, double confidence) {
    }

    private record RunFacts(Long scriptId, String scriptUri, Instant startedAt, Instant endedAt, Integer exitCode,
            String user, Set<Long> inputs, Set<Long> outputs) {
    }

    /** Datasets present at {@code asOf} (with a state in force), limited to {@code only} when given. */
    private static Map<Long, DatasetFacts> datasets(DSLContext db, Instant asOf, Set<Long> only) {
        Condition where = Validity.at(DATASET_STATE.VALID_FROM, DATASET_STATE.VALID_TO, asOf);
        if (only != null) {
            where = where.and(DATASET.ID.in(only));
        }
        Map<Long, DatasetFacts> out = new LinkedHashMap<>();
        db.select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND, DATASET_STATE.CONTENT_HASH)
                .from(DATASET).join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID))
                .where(where).orderBy(DATASET.ID)
                .forEach(r -> out.put(r.value1(), new DatasetFacts(r.value1(), r.value2(), r.value3(), r.value4(), r.value5())));
        return out;
    }

    private static List<EdgeFacts> edges(DSLContext db, Instant asOf, Set<Long> datasets) {
        var e = LINEAGE_EDGE;
        List<EdgeFacts> out = new ArrayList<>();
        db.select(e.SOURCE_DATASET_ID, e.TARGET_DATASET_ID, e.SCRIPT_ID, e.RUN_ID, e.EVIDENCE, e.CONFIDENCE)
                .from(e).where(Validity.at(e.VALID_FROM, e.VALID_TO, asOf)).orderBy(e.ID)
                .forEach(r -> {
                    if (datasets.contains(r.value1()) && datasets.contains(r.value2())) {
                        out.add(new EdgeFacts(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6()));
                    }
                });
        return out;
    }

    /** Runs started by {@code asOf} that touched a dataset in scope or back an edge in scope. */
    private static Map<String, RunFacts> runs(DSLContext db, Instant asOf, Set<Long> datasets, List<EdgeFacts> edges) {
        Map<String, RunFacts> out = new TreeMap<>();
        Condition started = asOf == null ? DSL.trueCondition()
                : RUN.STARTED_AT.le(OffsetDateTime.ofInstant(asOf, ZoneOffset.UTC));
        db.select(RUN.ID, RUN.SCRIPT_ID, RUN.SCRIPT_URI, RUN.STARTED_AT, RUN.ENDED_AT, RUN.EXIT_CODE, RUN.USER_NAME,
                        RUN_IO.DATASET_ID, RUN_IO.DIRECTION)
                .from(RUN).join(RUN_IO).on(RUN_IO.RUN_ID.eq(RUN.ID))
                .where(started).orderBy(RUN.ID, RUN_IO.ID)
                .forEach(r -> {
                    long dataset = r.value8();
                    if (!datasets.contains(dataset)) {
                        return;
                    }
                    RunFacts run = out.computeIfAbsent(r.value1(), id -> new RunFacts(r.value2(), r.value3(),
                            r.value4().toInstant(), r.value5() == null ? null : r.value5().toInstant(), r.value6(), r.value7(),
                            new TreeSet<>(), new TreeSet<>()));
                    String direction = r.value9();
                    if (direction.equals("read")) {
                        run.inputs().add(dataset);
                    } else if (direction.equals("write") || direction.equals("rename_to")) {
                        run.outputs().add(dataset);
                    }
                });
        for (EdgeFacts e : edges) {
            if (e.runId() != null && !out.containsKey(e.runId())) {
                var r = db.selectFrom(RUN).where(RUN.ID.eq(e.runId())).fetchOne();
                if (r != null) {
                    out.put(e.runId(), new RunFacts(r.getScriptId(), r.getScriptUri(), r.getStartedAt().toInstant(),
                            r.getEndedAt() == null ? null : r.getEndedAt().toInstant(), r.getExitCode(), r.getUserName(),
                            new TreeSet<>(), new TreeSet<>()));
                }
            }
        }
        return out;
    }

    private static Map<Long, String[]> scripts(DSLContext db, Set<Long> ids) {
        Map<Long, String[]> out = new TreeMap<>();
        if (!ids.isEmpty()) {
            db.select(SCRIPT.ID, SCRIPT.URI, SCRIPT.NAME).from(SCRIPT).where(SCRIPT.ID.in(ids))
                    .forEach(r -> out.put(r.value1(), new String[] {r.value2(), r.value3()}));
        }
        return out;
    }

    private static Map<Long, List<String>> owners(DSLContext db, Instant asOf, Set<Long> datasets) {
        Map<Long, List<String>> out = new TreeMap<>();
        db.select(DATASET_OWNER.DATASET_ID, OWNER.NAME).from(DATASET_OWNER).join(OWNER).on(OWNER.ID.eq(DATASET_OWNER.OWNER_ID))
                .where(Validity.at(DATASET_OWNER.VALID_FROM, DATASET_OWNER.VALID_TO, asOf))
                .orderBy(OWNER.NAME)
                .forEach(r -> {
                    if (datasets.contains(r.value1())) {
                        out.computeIfAbsent(r.value1(), k -> new ArrayList<>()).add(r.value2());
                    }
                });
        return out;
    }

    private static Map<String, String> ownerKinds(DSLContext db, Map<Long, List<String>> owners) {
        Set<String> names = new TreeSet<>();
        owners.values().forEach(names::addAll);
        Map<String, String> out = new TreeMap<>();
        if (!names.isEmpty()) {
            db.select(OWNER.NAME, OWNER.KIND).from(OWNER).where(OWNER.NAME.in(names))
                    .forEach(r -> out.put(r.value1(), r.value2()));
        }
        return out;
    }
}
