package org.headwater.impact;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import org.commonmark.ext.gfm.tables.TableBlock;
import org.commonmark.ext.gfm.tables.TableCell;
import org.commonmark.ext.gfm.tables.TableRow;
import org.commonmark.ext.gfm.tables.TablesExtension;
import org.commonmark.node.AbstractVisitor;
import org.commonmark.node.CustomBlock;
import org.commonmark.node.CustomNode;
import org.commonmark.node.Heading;
import org.commonmark.node.Node;
import org.commonmark.node.Text;
import org.commonmark.node.Code;
import org.commonmark.parser.Parser;
import org.headwater.Catalog;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.Neighbours;
import org.headwater.lineage.Query;
import org.headwater.lineage.QueryWords;
import org.headwater.lineage.Target;
import org.headwater.lineage.TargetException;
import org.headwater.lineage.Targets;
import org.headwater.store.LabelReader;
import org.headwater.store.OwnerReader;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Upstream, downstream and impact answers on the seed-library workspace. Every expected value is
 * worked out by reading the fixture's scripts (// reference: the fixture's code, read by hand; see its
 * README for the pipeline): which files each script reads and writes, which columns it copies
 * ({@code df[[...]]}, merge keys), computes ({@code a / b}, aggregates) or only filters on
 * ({@code df[df[c] < 6]}, SQL {@code WHERE}), and the owners its {@code headwater.owners} lines give.
 */
class SeedLibraryImpactTest {
    @TempDir
    static Path temp;

    static Catalog catalog;
    static Targets targets;
    static LabelReader labels;
    static ImpactAnalysis impact;

    @BeforeAll
    static void harvest() throws Exception {
        catalog = SeedLibrary.harvested(temp);
        OwnerReader owners = new OwnerReader(catalog.store());
        targets = new Targets(catalog.reader(), owners, catalog.lineage());
        labels = new LabelReader(catalog.store());
        impact = new ImpactAnalysis(catalog.lineage(), labels, owners);
    }

    @AfterAll
    static void close() {
        // Null when the set-up was skipped (no such component here): nothing to close.
        if (catalog != null) {
            catalog.close();
        }
    }

    private static Neighbours walk(String key, boolean upstream, Query query) {
        return Neighbours.of(catalog.lineage(), labels, targets.resolve(key), upstream, query);
    }

    private static List<String> reached(Neighbours n) {
        return n.results().stream()
                .map(r -> r.distance() + " " + r.name() + (r.column() == null ? "" : "." + r.column()) + (r.indirect() ? " (indirect)" : ""))
                .sorted().toList();
    }

    @Test
    void everythingMadeFromTheVarietyListIsDownstreamAtItsHopDistance() {
        // reference: enrich.py reads raw/varieties.csv; rates.py and flag_trays.py read its output; season.py
        // reads both of theirs (the diamond); plot_rates.py and running_log.py read work/season.csv.
        assertThat(reached(walk("raw/varieties.csv", false, Query.everything()))).containsExactly(
                "1 work/trays_enriched.csv",
                "2 work/low_trays.csv",
                "2 work/rates.csv",
                "3 work/season.csv",
                "4 figures/season_rates.png",
                "4 work/running_log.csv");
    }

    @Test
    void theDiamondReachesTheSeasonTableOnceAtTwoHopsWithOneOfItsTwoPaths() {
        Neighbours down = walk("work/trays_enriched.csv", false, Query.everything());
        Neighbours.Neighbour season = down.results().stream().filter(r -> r.name().equals("work/season.csv")).findFirst()
                .orElseThrow();
        assertThat(season.distance()).isEqualTo(2);
        String path = season.path().stream().map(s -> s.from() + ">" + s.script() + ">" + s.to()).collect(Collectors.joining(" "));
        // reference: season.py reads work/rates.csv (from rates.py) and work/low_trays.csv (from flag_trays.py)
        assertThat(path).isIn(
                "work/trays_enriched.csv>scripts/rates.py>work/rates.csv work/rates.csv>scripts/season.py>work/season.csv",
                "work/trays_enriched.csv>scripts/flag_trays.py>work/low_trays.csv work/low_trays.csv>scripts/season.py>work/season.csv");
        assertThat(walk("work/season.csv", true, Query.everything().withMaxDepth(1)).results())
                .extracting(Neighbours.Neighbour::name).containsExactlyInAnyOrder("work/rates.csv", "work/low_trays.csv");
    }

    @Test
    void theFigureIsMadeFromEveryInputUpToTheWeeklyTraySheets() {
        assertThat(reached(walk("figures/season_rates.png", true, Query.everything()))).containsExactly(
                "1 work/season.csv",
                "2 work/low_trays.csv",
                "2 work/rates.csv",
                "3 work/trays_enriched.csv",
                "4 raw/varieties.csv",
                "4 work/trays_all.csv",
                "5 " + SeedLibrary.SETS);
    }

    @Test
    void theRunningLogFeedsBackIntoItselfAndIsNotItsOwnDescendant() {
        // reference: running_log.py reads work/running_log.csv and writes it again
        Neighbours down = walk("work/running_log.csv", false, Query.everything());
        assertThat(down.startInCycle()).isTrue();
        assertThat(down.results()).isEmpty();
        Neighbours up = walk("work/running_log.csv", true, Query.everything());
        assertThat(up.startInCycle()).isTrue();
        assertThat(reached(up)).first().isEqualTo("1 work/season.csv");
    }

    @Test
    void aPartitionNamesItsSetWhoseLineageItShares() {
        Target week = targets.resolve("raw/trays/week=01/trays.csv");
        assertThat(week.dataset()).isEqualTo(SeedLibrary.SETS);
        assertThat(week.partition()).isEqualTo("raw/trays/week=01/trays.csv");
        assertThat(reached(walk("raw/trays/week=01/trays.csv", false, Query.everything().withMaxDepth(2))))
                .containsExactly("1 work/trays_all.csv", "2 work/trays_enriched.csv");
    }

    @Test
    void filtersLimitDepthEvidenceAndWhatIsReportedButNotThePathsThrough() {
        assertThat(reached(walk("raw/varieties.csv", false, QueryWords.parse("1", null, null, null, null, labels))))
                .containsExactly("1 work/trays_enriched.csv");
        // Static analysis found every edge here; nothing was seen at run time.
        assertThat(walk("raw/varieties.csv", false, QueryWords.parse(null, "runtime", null, null, null, labels)).results())
                .isEmpty();
        Neighbours figures = walk("raw/varieties.csv", false, QueryWords.parse(null, "static", "0.9", "figure", null, labels));
        assertThat(reached(figures)).containsExactly("4 figures/season_rates.png");
        assertThat(figures.results().get(0).path()).hasSize(4);
        assertThatThrownBy(() -> QueryWords.parse(null, "guessed", null, null, null, labels))
                .hasMessage("unknown evidence 'guessed'; use static, runtime, declared, inferred");
        assertThatThrownBy(() -> QueryWords.parse("0", null, null, null, null, labels))
                .hasMessage("depth must be at least 1, got 0");
    }

    @Test
    void aColumnUsedOnlyInAWhereClauseReachesTheViewsColumnsIndirectly() {
        // reference: sql/report.sql, "WHERE checked" decides the rows of rate_report and gives no values
        assertThat(reached(walk("variety_rate.checked", false, Query.everything()))).containsExactly(
                "1 rate_report.rate_percent (indirect)", "1 rate_report.variety_name (indirect)");
        assertThat(reached(walk("variety_rate.mean_rate", false, Query.everything())))
                .containsExactly("1 rate_report.rate_percent");
    }

    /** One affected entry as a line: distance, kind, name, flags and owners. */
    private static List<String> lines(ImpactReport report) {
        return report.affected().stream().map(a -> a.distance() + " " + a.kind() + " " + a.name()
                + (a.indirect() ? " indirect" : "") + (a.uncertain() ? " uncertain" : "")
                + " [" + a.owners().stream().map(o -> o.name() + (o.suggested() ? "?" : "")).collect(Collectors.joining(", ")) + "]")
                .toList();
    }

    @Test
    void droppingTheSproutedCountNamesEveryAffectedColumnScriptFigureAndOwner() {
        ImpactReport report = impact.report(targets.resolve("work/trays_enriched.csv.seeds_sprouted"), ChangeKind.DROP);
        // reference: rates.py computes germination_rate = seeds_sprouted / seeds_sown, then mean_rate;
        // flag_trays.py keeps the trays with seeds_sprouted < 6 (rows only); season.py copies mean_rate and
        // counts low trays per variety (poor_trays) joined on variety_name; plot_rates.py draws mean_rate;
        // running_log.py copies variety_name and mean_rate. Owners: headwater.owners lines 5 (work/**),
        // 7 (figures/*.png), 8 (work/running_log.csv: nobody); scripts: their git authors, suggested.
        assertThat(lines(report)).containsExactly(
                "1 dataset work/low_trays.csv indirect [trial-analysts]",
                "1 dataset work/rates.csv [trial-analysts]",
                "1 column work/low_trays.csv.tray_id indirect [trial-analysts]",
                "1 column work/low_trays.csv.variety_name indirect [trial-analysts]",
                "1 column work/rates.csv.mean_rate [trial-analysts]",
                "1 script scripts/flag_trays.py [Wren Maddox?]",
                "1 script scripts/rates.py [Ivo Marsh?, Wren Maddox?]",
                "2 dataset work/season.csv [trial-analysts]",
                "2 column work/season.csv.mean_rate [trial-analysts]",
                "2 column work/season.csv.poor_trays indirect [trial-analysts]",
                "2 column work/season.csv.variety_name indirect [trial-analysts]",
                "2 script scripts/season.py [Wren Maddox?]",
                "3 dataset work/running_log.csv [Wren Maddox?]",
                "3 figure figures/season_rates.png [newsletter, Tamsin Reed]",
                "3 column work/running_log.csv.mean_rate [Wren Maddox?]",
                "3 column work/running_log.csv.variety_name indirect [Wren Maddox?]",
                "3 script scripts/plot_rates.py [Ivo Marsh?, Wren Maddox?]",
                "3 script scripts/running_log.py [Wren Maddox?]");
        // Five people and teams to tell: trial-analysts, newsletter, Tamsin Reed, and Ivo Marsh and Wren Maddox.
        assertThat(report.counts()).isEqualTo(new ImpactReport.Counts(18, 4, 8, 5, 1, 0, 6, 0, 5));
        ImpactReport.Affected figure = report.affected().get(13);
        assertThat(figure.path()).extracting(s -> s.from() + (s.fromColumn() == null ? "" : "." + s.fromColumn()) + " > " + s.script())
                .containsExactly("work/trays_enriched.csv.seeds_sprouted > scripts/rates.py",
                        "work/rates.csv.mean_rate > scripts/season.py", "work/season.csv > scripts/plot_rates.py");
    }

    @Test
    void aLateEnrichedTableMakesEverythingDownstreamStaleAndNamesEveryScriptToRerun() {
        ImpactReport report = impact.report(targets.resolve("work/trays_enriched.csv"), ChangeKind.STALE);
        assertThat(lines(report)).containsExactly(
                "1 dataset work/low_trays.csv [trial-analysts]",
                "1 dataset work/rates.csv [trial-analysts]",
                "1 script scripts/flag_trays.py [Wren Maddox?]",
                "1 script scripts/rates.py [Ivo Marsh?, Wren Maddox?]",
                "2 dataset work/season.csv [trial-analysts]",
                "2 script scripts/season.py [Wren Maddox?]",
                "3 dataset work/running_log.csv [Wren Maddox?]",
                "3 figure figures/season_rates.png [newsletter, Tamsin Reed]",
                "3 script scripts/plot_rates.py [Ivo Marsh?, Wren Maddox?]",
                "3 script scripts/running_log.py [Wren Maddox?]");
        assertThat(report.title()).isEqualTo("Impact of work/trays_enriched.csv being late or stale");
    }

    @Test
    void deletingAWeeklySheetIsDeletingInputOfTheWholeSet() {
        ImpactReport report = impact.report(targets.resolve("raw/trays/week=02/trays.csv"), ChangeKind.of("move"));
        assertThat(report.change()).isEqualTo("delete");
        assertThat(report.target().dataset()).isEqualTo(SeedLibrary.SETS);
        // reference: combine_trays.py reads every week; everything after it is downstream
        assertThat(report.counts().datasets()).isEqualTo(6);
        assertThat(report.counts().scripts()).isEqualTo(7);
        assertThat(report.counts().figures()).isEqualTo(1);
        assertThat(lines(report).get(0)).isEqualTo("1 dataset work/trays_all.csv [Wren Maddox]");
    }

    @Test
    void droppingAColumnOnlyAViewFiltersOnListsTheViewAndItsColumnsAsIndirect() {
        ImpactReport report = impact.report(targets.resolve("variety_rate.checked"), ChangeKind.DROP);
        // No rule covers SQL tables and views; the author of the file that defines the view is suggested.
        assertThat(lines(report)).containsExactly(
                "1 view rate_report indirect [Wren Maddox?]",
                "1 column rate_report.rate_percent indirect [Wren Maddox?]",
                "1 column rate_report.variety_name indirect [Wren Maddox?]",
                "1 script sql/report.sql indirect [Wren Maddox?]");
    }

    @Test
    void aChangeKindMustFitItsTarget() {
        Target dataset = targets.resolve("work/rates.csv");
        assertThatThrownBy(() -> impact.report(dataset, ChangeKind.RENAME))
                .hasMessage("rename is a change to a column; name it as dataset.column");
        Target column = targets.resolve("work/rates.csv.mean_rate");
        assertThatThrownBy(() -> impact.report(column, ChangeKind.DELETE))
                .hasMessage("delete is a change to a whole dataset; name the dataset without a column");
        assertThatThrownBy(() -> targets.resolve("work/rates.csv.no_such_column")).isInstanceOf(TargetException.class)
                .hasMessage("Dataset work/rates.csv has no column 'no_such_column'");
        assertThatThrownBy(() -> ChangeKind.of("shrink"))
                .hasMessage("unknown change 'shrink'; use drop, rename, retype, delete, stale (or move)");
    }

    @Test
    void theMarkdownReadsBackAsOneTablePerDistanceWithEveryAffectedRow() {
        ImpactReport report = impact.report(targets.resolve("work/rates.csv.mean_rate"), ChangeKind.RENAME);
        String markdown = ImpactMarkdown.render(report);
        // expected: GitHub Flavored Markdown tables as commonmark-java's gfm-tables extension reads them
        Parser parser = Parser.builder().extensions(List.of(TablesExtension.create())).build();
        Node document = parser.parse(markdown);
        List<String> headings = new java.util.ArrayList<>();
        List<List<String>> rows = new java.util.ArrayList<>();
        document.accept(new AbstractVisitor() {
            @Override
            public void visit(Heading heading) {
                headings.add(text(heading));
            }

            @Override
            public void visit(CustomBlock block) {
                if (block instanceof TableBlock) {
                    collectRows(block, rows);
                }
            }
        });
        assertThat(headings).containsExactly("Impact of renaming column work/rates.csv.mean_rate", "1 hop", "2 hops");
        // Header rows plus one row per affected entry, five cells each.
        assertThat(rows).hasSize(2 + report.affected().size());
        assertThat(rows).allSatisfy(r -> assertThat(r).hasSize(5));
        assertThat(rows.get(1)).containsExactly("work/season.csv", "dataset",
                "holds columns made from the renamed column", "trial-analysts (team)",
                "work/rates.csv.mean_rate → work/season.csv.mean_rate via scripts/season.py (static 0.95, direct)");
        assertThat(rows.stream().map(r -> r.get(0)).toList()).containsExactlyElementsOf(
                interleaveHeaders(report));
    }

    private static List<String> interleaveHeaders(ImpactReport report) {
        List<String> expected = new java.util.ArrayList<>();
        int distance = 0;
        for (ImpactReport.Affected a : report.affected()) {
            if (a.distance() != distance) {
                expected.add("affected");
                distance = a.distance();
            }
            expected.add(a.name());
        }
        return expected;
    }

    private static void collectRows(Node table, List<List<String>> rows) {
        for (Node n = table.getFirstChild(); n != null; n = n.getNext()) {
            for (Node row = n.getFirstChild(); row != null; row = row.getNext()) {
                if (row instanceof TableRow) {
                    List<String> cells = new java.util.ArrayList<>();
                    for (Node cell = row.getFirstChild(); cell != null; cell = cell.getNext()) {
                        if (cell instanceof TableCell) {
                            cells.add(text(cell));
                        }
                    }
                    rows.add(cells);
                }
            }
        }
    }

    private static String text(Node node) {
        StringBuilder sb = new StringBuilder();
        node.accept(new AbstractVisitor() {
            @Override
            public void visit(Text text) {
                sb.append(text.getLiteral());
            }

            @Override
            public void visit(Code code) {
                sb.append(code.getLiteral());
            }

            @Override
            public void visit(CustomNode custom) {
                visitChildren(custom);
            }
        });
        return sb.toString();
    }
}
