package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.StringReader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.lucene.analysis.TokenStream;
import org.apache.lucene.analysis.tokenattributes.CharTermAttribute;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.headwater.testing.FlatFolders;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SearchIndexTest {

    @TempDir
    Path temp;

    static List<String> tokens(org.apache.lucene.analysis.Analyzer analyzer, String text) throws IOException {
        List<String> out = new ArrayList<>();
        try (TokenStream stream = analyzer.tokenStream("name", new StringReader(text))) {
            CharTermAttribute term = stream.addAttribute(CharTermAttribute.class);
            stream.reset();
            while (stream.incrementToken()) {
                out.add(term.toString());
            }
            stream.end();
        }
        return out;
    }

    @Test
    void identifiersSplitOnSnakeCaseCamelCasePathsAndDigitsAndKeepTheWhole() throws IOException {
        // common practice, no source: how data people name files and columns.
        assertThat(tokens(IdentifierAnalyzer.forQueries(), "stations/monthlyReadings_2025.csv"))
                .containsExactly("stations", "monthly", "readings", "2025", "csv");
        assertThat(tokens(IdentifierAnalyzer.forIndexing(), "nitrate_mg_l"))
                .containsExactlyInAnyOrder("nitrate_mg_l", "nitrate", "mg", "l");
        assertThat(tokens(IdentifierAnalyzer.forQueries(), "Température")).containsExactly("temperature");
    }

    @Test
    void findsTheNitrateDatasetFirstAndADatasetByAWordOfOneOfItsColumns() throws IOException {
        try (Catalog catalog = TestCatalogs.reopenable(temp.resolve("catalog"))) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);

            assertThat(catalog.index().search("nitrate", null, 5).get(0).name()).isEqualTo("lab/nitrate_results_2025.csv");
            // "sulfate" is only a word of the column sulfate_mg_l: in two files and the table sql/views.sql defines.
            assertThat(catalog.index().search("sulfate", null, 10)).filteredOn(h -> !h.kind().equals("column"))
                    .extracting(SearchHit::name)
                    .containsExactlyInAnyOrder("lab/ion_chromatograph_2025.csv", "derived/lab_merged.csv", "lab_result");
            // sql/views.sql follows: its header "lab_result <- derived/lab_merged.csv" has the three words, stemmed.
            assertThat(catalog.index().search("merge_lab_results", "script", 10)).extracting(SearchHit::name)
                    .containsExactly("scripts/merge_lab_results.py", "sql/views.sql");
        }
    }

    @Test
    void aMissingOrDamagedIndexIsRebuiltFromTheStoreAtOpen() throws IOException {
        Path dataDir = temp.resolve("catalog");
        int documents;
        try (Catalog catalog = TestCatalogs.reopenable(dataDir)) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            documents = catalog.index().documentCount();
        }
        // Damage: overwrite every index file with junk, as a crash mid-write or a bad disk might.
        try (Stream<Path> files = Files.list(dataDir.resolve("index"))) {
            for (Path f : (Iterable<Path>) files::iterator) {
                if (!f.getFileName().toString().equals("write.lock")) {
                    Files.write(f, new byte[] {1, 2, 3});
                }
            }
        }
        try (Catalog catalog = TestCatalogs.reopenable(dataDir)) {
            assertThat(catalog.index().documentCount()).isEqualTo(documents).isEqualTo(162); // 16 file datasets, 5 SQL tables and views, 8 scripts, 133 columns
            assertThat(catalog.index().search("nitrate", null, 1).get(0).name()).isEqualTo("lab/nitrate_results_2025.csv");
        }
    }

    @Test
    void anIndexThatFellBehindTheStoreCatchesUpFromTheChangeLog() throws IOException {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("first.csv"), "a\n1\n");
        Path dataDir = temp.resolve("catalog");
        Path staleIndex = temp.resolve("stale-index");
        try (Catalog catalog = TestCatalogs.reopenable(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        FlatFolders.copy(dataDir.resolve("index"), staleIndex);
        Files.writeString(lake.resolve("second_reservoir.csv"), "b\n2\n");
        try (Catalog catalog = TestCatalogs.reopenable(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        // Put back the index as it was before the second harvest: the store is ahead of it now.
        FlatFolders.delete(dataDir.resolve("index"));
        FlatFolders.copy(staleIndex, dataDir.resolve("index"));
        try (Catalog catalog = TestCatalogs.reopenable(dataDir)) {
            assertThat(catalog.index().absorbedSeq()).isEqualTo(catalog.reader().lastChangeSeq());
            assertThat(catalog.index().search("reservoir", "file", 5)).extracting(SearchHit::name)
                    .containsExactly("second_reservoir.csv");
            assertThat(catalog.index().documentCount()).isEqualTo(4); // 2 datasets and their columns a and b
        }
    }
}
