package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import org.apache.commons.text.StringEscapeUtils;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.ingest.Observation;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Query syntax, facets, snippets, suggestions and explanations, on the demo workspace. */
class SearchFeaturesTest {
    @TempDir
    static Path temp;

    static Catalog catalog;

    @BeforeAll
    static void harvestTheDemo() throws IOException {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
    }

    @AfterAll
    static void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    static SearchResult search(String text) {
        return catalog.index().search(new SearchRequest(text, null, 1, 50, true));
    }

    @Test
    void malformedQueriesAreRefusedWithTheProblemAndItsPosition() {
        assertThatThrownBy(() -> search("nitrate \"monthly summ"))
                .isInstanceOf(QuerySyntaxException.class)
                .hasMessage("The quote opened at position 9 is never closed");
        assertThatThrownBy(() -> search("colour=red"))
                .hasMessage("Unknown filter 'colour' at position 1; filters are format, fresh, kind, owner, source, tag (written field=value)");
        assertThatThrownBy(() -> search("nitrate kind="))
                .hasMessage("The filter 'kind=' at position 9 needs a value, such as kind=csv or kind=\"two words\"");
    }

    @Test
    void filtersNarrowToAKindAndFacetsCountWhatTheStoreHolds() {
        SearchResult figures = search("kind=figure");
        // expected: the store's own list of figures (CatalogReader.datasets, SQL), grouped by format by hand here.
        List<DatasetSummary> stored = catalog.reader().datasets("figure", 0, 100, null);
        Map<String, Integer> formats = new TreeMap<>();
        stored.forEach(d -> formats.merge(d.format(), 1, Integer::sum));
        assertThat(figures.total()).isEqualTo(stored.size()).isEqualTo(3);
        assertThat(figures.facets().get("kind")).isEqualTo(Map.of("figure", 3));
        assertThat(new TreeMap<>(figures.facets().get("format"))).isEqualTo(formats);
        assertThat(figures.facets().get("freshness")).isEqualTo(Map.of("unknown", 3));
        assertThat(search("kind=figure kind=script").total()).isEqualTo(3 + 8);
        assertThat(search("format=csv kind=file").hits()).extracting(SearchHit::format).containsOnly("csv");
    }

    @Test
    void theFreshnessFacetCountsTheStatesTheProviderGives() {
        catalog.index().useFreshness(id -> id % 2 == 0 ? "fresh" : "late");
        try {
            SearchResult files = search("kind=file");
            long even = files.hits().stream().filter(h -> h.id() % 2 == 0).count();
            assertThat(files.facets().get("freshness"))
                    .isEqualTo(Map.of("fresh", (int) even, "late", (int) (files.total() - even)));
        } finally {
            catalog.index().useFreshness(FreshnessProvider.UNKNOWN);
        }
    }

    @Test
    void theFreshFilterKeepsDatasetsInTheGivenStatesAndTheirColumnsButNoScriptsOrOwners() {
        catalog.index().useFreshness(id -> id % 2 == 0 ? "fresh" : "late");
        try {
            SearchResult late = catalog.index().search(new SearchRequest("nitrate fresh=late", null, 1, 200, false));
            SearchResult all = catalog.index().search(new SearchRequest("nitrate", null, 1, 200, false));
            // expected: the unfiltered result narrowed to hits of datasets with an odd id (a column hit's id is its
            // dataset's); scripts and owners have no freshness, so they leave.
            List<String> expected = all.hits().stream()
                    .filter(h -> !h.kind().equals("script") && !h.kind().equals("owner") && !h.kind().equals("team"))
                    .filter(h -> h.id() % 2 == 1).map(SearchHit::name).sorted().toList();
            assertThat(late.hits()).extracting(SearchHit::name).isNotEmpty().doesNotHaveDuplicates();
            assertThat(late.hits().stream().map(SearchHit::name).sorted().toList()).isEqualTo(expected);
            assertThat(late.facets().get("freshness").keySet()).containsExactly("late");
            assertThat(catalog.index().search(new SearchRequest("nitrate fresh=late fresh=fresh", null, 1, 200, false))
                    .total()).isEqualTo(all.hits().stream().filter(h -> !h.kind().equals("script")
                            && !h.kind().equals("owner") && !h.kind().equals("team")).count());
        } finally {
            catalog.index().useFreshness(FreshnessProvider.UNKNOWN);
        }
    }

    @Test
    void theFreshFilterAcceptsTheStatesTheChecksRecordAndNoOthers() {
        // expected: the five states of checks.FreshnessState, which the search package cannot see itself.
        assertThat(FreshnessProvider.STATES).containsExactlyElementsOf(java.util.Arrays.stream(
                org.headwater.checks.FreshnessState.values()).map(org.headwater.checks.FreshnessState::word).toList());
        assertThatThrownBy(() -> search("nitrate fresh=old")).isInstanceOf(QuerySyntaxException.class)
                .hasMessage("The filter 'fresh=' at position 9 takes a freshness state: fresh, due, late, stale, unknown (not 'old')");
        assertThat(search("FRESH=Unknown kind=figure").total()).isEqualTo(3);
    }

    @Test
    void aQuotedPhraseMustAppearInThatOrder() {
        // "ion balance" is the title of fig3 (and a word pair of its file name); "balance ion" appears nowhere.
        assertThat(search("\"ion balance\"").hits()).extracting(SearchHit::name)
                .first().isEqualTo("bulletin/figures/fig3_ion_balance.pdf");
        assertThat(search("\"balance ion\"").hits()).isEmpty();
    }

    @Test
    void snippetsMarkTheMatchesAndEscapeEverythingElse() {
        // A description with markup, set through the ingestion path like an API edit.
        String uri = catalog.reader().findDatasets("stations/station_register.csv").get(0).uri();
        String description = "Stations <b>& \"weirs\"</b> with their kilometre on the river's course/reach";
        catalog.ingestor().apply("test", List.of(new Observation.NoteSet(uri, description, Set.of("reference"), "t.vale")));
        SearchHit hit = search("kilometre").hits().get(0);
        assertThat(hit.name()).isEqualTo("stations/station_register.csv");
        assertThat(hit.snippet()).contains("<mark>kilometre</mark>").doesNotContain("<b>");
        // expected: Apache Commons Text's HTML 4 unescaper turns the snippet back into the description.
        assertThat(StringEscapeUtils.unescapeHtml4(hit.snippet().replace("<mark>", "").replace("</mark>", "")))
                .isEqualTo(description);
        assertThat(search("tag=reference").hits()).extracting(SearchHit::name)
                .contains("stations/station_register.csv");
    }

    @Test
    void aMisspelledWordGetsADidYouMeanAndAKnownWordNone() {
        // Words of the demo: nitrate (lab/nitrate_results_2025.csv), station, register.
        assertThat(search("nitarte").suggestion()).isEqualTo("nitrate");
        assertThat(search("statoin register").suggestion()).isEqualTo("station register");
        assertThat(search("nitrate").suggestion()).isNull();
    }

    @Test
    void typosWithinTheEditsAllowedForTheirLengthStillFind() {
        // Damerau-Levenshtein distance 1 (a swap) for a 7-letter word, 2 for a 12-letter one.
        assertThat(LuceneQueries.editsFor("ph")).isZero();
        assertThat(LuceneQueries.editsFor("nitrate")).isEqualTo(1);
        assertThat(LuceneQueries.editsFor("conductivity")).isEqualTo(2);
        assertThat(search("nitarte").hits().get(0).name()).isEqualTo("lab/nitrate_results_2025.csv");
        assertThat(search("condcutivtiy").hits().get(0).name()).isEqualTo("lab/conductivity_legacy_2025.csv");
    }

    @Test
    void aWordBeginningFindsAsYouType() {
        SearchHit first = search("chromat").hits().get(0);
        assertThat(first.name()).isEqualTo("lab/ion_chromatograph_2025.csv");
        // The explanation names the beginning the way it was typed, not the automaton behind it.
        assertThat(first.explain().matched()).contains("name:chromat*");
    }

    @Test
    void anExactNameRanksFirstAndExplainsItself() {
        SearchHit first = search("station").hits().get(0);
        assertThat(first.name()).isEqualTo("station");
        assertThat(first.explain().exactName()).isTrue();
        assertThat(first.explain().text()).isGreaterThan(1000);
        assertThat((double) first.score()).isCloseTo(first.explain().text() * first.explain().factor(),
                org.assertj.core.data.Offset.offset(first.score() * 1e-5));
    }

    @Test
    void useCountsAreTheScriptsThatReadADataset() {
        SearchHit merged = search("kind=file lab_merged").hits().get(0);
        assertThat(merged.name()).isEqualTo("derived/lab_merged.csv");
        // expected: the read references the store holds for every script (CatalogReader.references), counted here.
        long readers = search("kind=script").hits().stream()
                .filter(s -> catalog.reader().references(s.id()).stream()
                        .anyMatch(r -> r.direction().equals("read") && "derived/lab_merged.csv".equals(r.dataset())))
                .count();
        // The demo's own header says so too: models/trend_model.R "Reads ... derived/lab_merged.csv"; no runs reported.
        assertThat(readers).isEqualTo(1);
        assertThat(merged.explain().uses()).isEqualTo((int) readers);
        assertThat(merged.explain().centrality()).isGreaterThan(1.0);
    }

    @Test
    void columnsAreTheirOwnHitsWithTheirDataset() {
        SearchHit column = search("detection limit").hits().get(0);
        assertThat(column.kind()).isEqualTo("column");
        assertThat(column.name()).isEqualTo("lab/nitrate_results_2025.csv#detection_limit_mg_l");
        assertThat(column.snippet()).isEqualTo("<mark>detection_limit_mg_l</mark>");
    }

    @Test
    void scriptsAreFoundByTheirDocstringsAndFiguresByTheirTitles() {
        // scripts/config.py's docstring: "Shared path constants for the Quillwater lab scripts."
        assertThat(search("shared path constants").hits().get(0).name()).isEqualTo("scripts/config.py");
        // fig2's SVG title: "Quillwater basin — mean dissolved oxygen by station, March–April 2025".
        assertThat(search("mean dissolved oxygen kind=figure").hits()).extracting(SearchHit::name)
                .containsExactly("bulletin/figures/fig2_do_by_station.svg");
    }
}
