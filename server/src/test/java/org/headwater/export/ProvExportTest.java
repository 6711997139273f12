package org.headwater.export;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;

import java.io.ByteArrayOutputStream;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.time.Instant;
import java.util.HexFormat;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.apache.jena.query.QueryExecution;
import org.apache.jena.query.QuerySolution;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.ModelFactory;
import org.apache.jena.riot.Lang;
import org.apache.jena.riot.RDFParser;
import org.apache.jena.riot.system.ErrorHandlerFactory;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.ingest.Observation;
import org.headwater.store.Validity;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The PROV-O export read back by a reference RDF toolkit (Apache Jena: its JSON-LD parser and SPARQL engine).
 * Terms and their domains and ranges: W3C PROV-O Recommendation, 30 April 2013, sections 3.1 and 3.3.
 */
class ProvExportTest {
    private static final String PREFIXES = """
            PREFIX prov: <http://www.w3.org/ns/prov#>
            PREFIX xsd: <http://www.w3.org/2001/XMLSchema#>
            PREFIX rdfs: <http://www.w3.org/2000/01/rdf-schema#>
            """;

    static {
        // Jena probes a StAX property the JDK's parser lacks and logs it as an error; nothing here reads RDF/XML.
        System.setProperty("org.slf4j.simpleLogger.log.org.apache.jena.util.JenaXMLInput", "off");
    }

    @TempDir
    Path temp;

    @Test
    void everyCatalogEdgeIsOneWasDerivedFromAndTheDocumentParsesStrictly() throws Exception {
        Path lake = Workspaces.demoCopy(temp);
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            Model model = parse(export(catalog, ProvScope.whole(null)));

            Set<String> expected = storeEdges(catalog, null);
            assertThat(expected).isNotEmpty();
            assertThat(pairs(model, "SELECT ?t ?s WHERE { ?t prov:wasDerivedFrom ?s }", "t", "s")).isEqualTo(expected);
            // Every present dataset is a prov:Entity; the demo holds 21 (README, "The demo workspace").
            assertThat(count(model, "SELECT (COUNT(DISTINCT ?e) AS ?n) WHERE { ?e a prov:Entity ; <urn:headwater:vocab:kind> ?k }"))
                    .isEqualTo(21);
            // PROV-O 3.1: prov:wasDerivedFrom has domain and range prov:Entity.
            assertThat(ask(model, "ASK { ?t prov:wasDerivedFrom ?s FILTER NOT EXISTS { ?s a prov:Entity } }")).isFalse();
            // PROV-O 3.3: a qualified derivation names its source entity with prov:entity.
            assertThat(pairs(model, "SELECT ?t ?s WHERE { ?t prov:qualifiedDerivation [ prov:entity ?s ] }", "t", "s"))
                    .isEqualTo(expected);
        }
    }

    @Test
    void aRunIsAnActivityThatUsedItsInputsGeneratedItsOutputAndFollowedItsScriptAsPlan() throws Exception {
        Path lake = Workspaces.demoCopy(temp);
        Path input = lake.resolve("derived/trend_coefficients.csv");
        Path output = lake.resolve("bulletin/figures/fig1_no3_trend.png");
        Path script = lake.resolve("models/trend_model.R");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            Instant beforeRun = Instant.now();
            Thread.sleep(5);
            Instant started = Instant.now().truncatedTo(java.time.temporal.ChronoUnit.MILLIS);
            catalog.ingestor().apply("test", List.of(new Observation.RunReported("run-0001", "test-client",
                    script.toUri().toString(), sha256(script), null, started, started.plusSeconds(3), 0, null, "ana.reyes-fox",
                    "bench-7", "[]", List.of(
                            new Observation.RunIo(input.toUri().toString(), "read", Files.size(input), sha256(input), "read.csv",
                                    null, null),
                            new Observation.RunIo(output.toUri().toString(), "write", Files.size(output), sha256(output),
                                    "png", null, null)))));
            catalog.ingestor().apply("test", List.of(new Observation.OwnerAssigned(output.toUri().toString(),
                    "figures-desk", "team", "test")));

            Model model = parse(export(catalog, ProvScope.whole(null)));
            String run = "urn:headwater:run:run-0001";
            assertThat(ask(model, "ASK { <" + run + "> a prov:Activity ; prov:used <" + input.toUri() + "> }")).isTrue();
            assertThat(ask(model, "ASK { <" + output.toUri() + "> prov:wasGeneratedBy <" + run + "> }")).isTrue();
            assertThat(ask(model, "ASK { <" + run + "> prov:qualifiedAssociation [ prov:hadPlan <" + script.toUri()
                    + "> ] . <" + script.toUri() + "> a prov:Plan }")).isTrue();
            assertThat(ask(model, "ASK { <" + run + "> prov:startedAtTime \"" + started + "\"^^xsd:dateTime }")).isTrue();
            assertThat(ask(model, "ASK { <" + run + "> prov:wasAssociatedWith ?who . ?who a prov:Person ; rdfs:label \"ana.reyes-fox\" }"))
                    .isTrue();
            assertThat(ask(model, "ASK { <" + output.toUri() + "> prov:wasAttributedTo ?o . ?o a prov:Organization ; "
                    + "rdfs:label \"figures-desk\" }")).isTrue();
            // PROV-O 3.1: prov:used has domain prov:Activity and range prov:Entity.
            assertThat(ask(model, "ASK { ?a prov:used ?e FILTER NOT EXISTS { ?a a prov:Activity . ?e a prov:Entity } }")).isFalse();
            // The runtime edge the run added is a derivation like any other.
            assertThat(pairs(model, "SELECT ?t ?s WHERE { ?t prov:wasDerivedFrom ?s }", "t", "s"))
                    .isEqualTo(storeEdges(catalog, null));

            // As of a moment before the run: no activity, and only the edges in force then.
            Model before = parse(export(catalog, ProvScope.whole(beforeRun)));
            assertThat(count(before, "SELECT (COUNT(?a) AS ?n) WHERE { ?a a prov:Activity }")).isZero();
            assertThat(pairs(before, "SELECT ?t ?s WHERE { ?t prov:wasDerivedFrom ?s }", "t", "s"))
                    .isEqualTo(storeEdges(catalog, beforeRun));
        }
    }

    @Test
    void aNeighbourhoodHoldsOnlyDatasetsWithinTheGivenHops() throws Exception {
        Path lake = Workspaces.demoCopy(temp);
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            long figure = catalog.reader().findDatasets("fig1_no3_trend.png").get(0).id();
            Model model = parse(export(catalog, ProvScope.around(figure, 1, null)));
            Set<String> entities = strings(model, "SELECT ?e WHERE { ?e a prov:Entity ; <urn:headwater:vocab:kind> ?k }", "e");
            Set<String> expected = new TreeSet<>();
            expected.add(catalog.reader().dataset(figure, null).orElseThrow().uri());
            for (long id : catalog.lineage().upstream(figure, org.headwater.lineage.Query.everything().withMaxDepth(1)).datasetIds()) {
                expected.add(catalog.reader().dataset(id, null).orElseThrow().uri());
            }
            assertThat(entities).isEqualTo(expected).hasSizeGreaterThan(1);
        }
    }

    private static String sha256(Path file) throws Exception {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(file)));
    }

    private static String export(Catalog catalog, ProvScope scope) throws Exception {
        var out = new ByteArrayOutputStream();
        new ProvExport(catalog.store()).write(scope, out);
        return out.toString(StandardCharsets.UTF_8);
    }

    /** Parses with Jena's strict error handler: any warning about an IRI or a literal fails the test. */
    private static Model parse(String jsonLd) {
        Model model = ModelFactory.createDefaultModel();
        RDFParser.create().source(new StringReader(jsonLd)).lang(Lang.JSONLD)
                .errorHandler(ErrorHandlerFactory.errorHandlerStrict).parse(model);
        return model;
    }

    /** The catalog's dataset edges in force at {@code asOf}, as "target <- source" URI pairs. */
    private static Set<String> storeEdges(Catalog catalog, Instant asOf) {
        var source = DATASET.as("s");
        var target = DATASET.as("t");
        Set<String> out = new TreeSet<>();
        catalog.store().dsl().select(target.URI, source.URI).from(LINEAGE_EDGE)
                .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                .join(target).on(target.ID.eq(LINEAGE_EDGE.TARGET_DATASET_ID))
                .where(Validity.at(LINEAGE_EDGE.VALID_FROM, LINEAGE_EDGE.VALID_TO, asOf))
                .forEach(r -> out.add(r.value1() + " <- " + r.value2()));
        return out;
    }

    private static Set<String> pairs(Model model, String select, String a, String b) {
        Set<String> out = new TreeSet<>();
        try (QueryExecution q = QueryExecution.model(model).query(PREFIXES + select).build()) {
            q.execSelect().forEachRemaining((QuerySolution s) -> out.add(s.getResource(a).getURI() + " <- " + s.getResource(b).getURI()));
        }
        return out;
    }

    private static Set<String> strings(Model model, String select, String var) {
        Set<String> out = new TreeSet<>();
        try (QueryExecution q = QueryExecution.model(model).query(PREFIXES + select).build()) {
            q.execSelect().forEachRemaining((QuerySolution s) -> out.add(s.getResource(var).getURI()));
        }
        return out;
    }

    private static long count(Model model, String select) {
        try (QueryExecution q = QueryExecution.model(model).query(PREFIXES + select).build()) {
            return q.execSelect().next().getLiteral("n").getLong();
        }
    }

    private static boolean ask(Model model, String ask) {
        try (QueryExecution q = QueryExecution.model(model).query(PREFIXES + ask).build()) {
            return q.execAsk();
        }
    }
}
