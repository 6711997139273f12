package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import java.nio.file.Files;
import java.nio.file.Path;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.ModelFactory;
import org.apache.jena.riot.RDFDataMgr;
import org.apache.jena.vocabulary.RDF;
import org.headwater.testing.Cli.Ran;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code headwater export --prov}: the file it writes is PROV-O that a reference RDF parser (Apache Jena) reads. */
class ExportCommandTest {
    private static final String PROV = "http://www.w3.org/ns/prov#";

    static {
        // Jena probes a StAX property the JDK's parser lacks and logs it as an error; nothing here reads RDF/XML.
        System.setProperty("org.slf4j.simpleLogger.log.org.apache.jena.util.JenaXMLInput", "off");
    }

    @TempDir
    Path temp;

    @Test
    void exportWritesAProvDocumentWithOneEntityPerDatasetAndANeighbourhoodToStandardOutput() throws Exception {
        String dataDir = temp.resolve("c").toString();
        run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir);
        Path file = temp.resolve("lineage.jsonld");

        Ran whole = run("export", "--prov", file.toString(), "--data-dir", dataDir);
        assertThat(whole.exit()).isZero();
        assertThat(whole.err()).contains("Wrote").contains("21 entities");
        Model model = RDFDataMgr.loadModel(file.toString()); // .jsonld: Jena picks its JSON-LD reader by extension
        // 21 datasets (README "The demo workspace") plus the scripts, which PROV-O also makes entities (prov:Plan).
        long datasets = model.listSubjectsWithProperty(model.createProperty("urn:headwater:vocab:kind")).toList().size();
        assertThat(datasets).isEqualTo(21);
        assertThat(model.listSubjectsWithProperty(RDF.type, model.createResource(PROV + "Plan")).toList()).isNotEmpty();

        Ran near = run("export", "--prov", "-", "--dataset", "fig1_no3_trend.png", "--depth", "1", "--data-dir", dataDir);
        assertThat(near.exit()).isZero();
        Model small = ModelFactory.createDefaultModel();
        org.apache.jena.riot.RDFParser.fromString(near.out(), org.apache.jena.riot.Lang.JSONLD).parse(small);
        assertThat(small.listSubjectsWithProperty(small.createProperty("urn:headwater:vocab:kind")).toList().size())
                .isBetween(2, 20);
        assertThat(Files.list(temp).filter(p -> p.getFileName().toString().endsWith(".tmp")).count()).isZero();
    }

    @Test
    void aNegativeDepthIsAUsageError() {
        Ran bad = run("export", "--prov", "-", "--depth", "-1", "--data-dir", temp.resolve("c").toString());
        assertThat(bad.exit()).isEqualTo(Main.USAGE);
        assertThat(bad.err()).contains("--depth");
    }
}
