package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The search, scored on a query set judged by hand on the demo workspace
 * ({@code search/demo-judgements.tsv}) with normalised discounted cumulative gain at 10.
 */
class DemoSearchRelevanceTest {
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

    record Judged(String query, Map<String, Integer> grades) {
    }

    static List<Judged> judgements(String resource) throws IOException {
        List<Judged> out = new ArrayList<>();
        try (InputStream in = DemoSearchRelevanceTest.class.getResourceAsStream(resource)) {
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (line.isBlank() || line.startsWith("#")) {
                    continue;
                }
                String[] cols = line.split("\t");
                Map<String, Integer> grades = new LinkedHashMap<>();
                for (String pair : cols[1].split(";")) {
                    int eq = pair.lastIndexOf('=');
                    grades.put(pair.substring(0, eq).strip(), Integer.parseInt(pair.substring(eq + 1).strip()));
                }
                out.add(new Judged(cols[0], grades));
            }
        }
        return out;
    }

    /**
     * Discounted cumulative gain as Järvelin and Kekäläinen define it (ACM TOIS 20(4), 2002, section 2.2):
     * DCG[1] = G[1] and, from rank b = 2 on, DCG[i] = DCG[i-1] + G[i] / log_b(i); the gain is the grade.
     */
    static double dcg(List<Integer> gains, int cutoff) {
        double dcg = 0;
        for (int i = 1; i <= Math.min(cutoff, gains.size()); i++) {
            double g = gains.get(i - 1);
            dcg += i < 2 ? g : g / (Math.log(i) / Math.log(2));
        }
        return dcg;
    }

    /** nDCG: DCG of the ranking divided by the DCG of the ideal ranking (all judged results, best first). */
    static double ndcg(List<String> ranked, Map<String, Integer> grades, int cutoff) {
        List<Integer> gains = ranked.stream().limit(cutoff).map(n -> grades.getOrDefault(n, 0)).toList();
        List<Integer> ideal = grades.values().stream().sorted((a, b) -> b - a).toList();
        return dcg(gains, cutoff) / dcg(ideal, cutoff);
    }

    @Test
    void dcgFollowsTheDefinitionOfJarvelinAndKekalainen() {
        // expected: Järvelin and Kekäläinen 2002, section 2.2, b = 2: gains 3, 2, 3, 0, 1 give
        // 3 + 2/log2(2) + 3/log2(3) + 0 + 1/log2(5) = 3 + 2 + 1.8928 + 0.4307 = 7.3235 (worked by hand).
        assertThat(dcg(List.of(3, 2, 3, 0, 1), 10)).isCloseTo(7.3235, org.assertj.core.data.Offset.offset(1e-4));
        assertThat(ndcg(List.of("a", "b"), Map.of("a", 3, "b", 2), 10)).isEqualTo(1.0);
        // Swapped: (2 + 3) / (3 + 2) is also 1 at b = 2, a known property of the base-2 discount for ranks 1 and 2.
        assertThat(ndcg(List.of("b", "a"), Map.of("a", 3, "b", 2), 10)).isEqualTo(1.0);
        assertThat(ndcg(List.of("x", "b", "a"), Map.of("a", 3, "b", 2), 10))
                .isCloseTo((0 + 2 + 3 / (Math.log(3) / Math.log(2))) / 5.0, org.assertj.core.data.Offset.offset(1e-12));
    }

    @Test
    void theJudgedQuerySetScoresAtLeastPointNineNdcgAtTenWithTheFirstHitRelevantForFourInFive() throws IOException {
        assertMeetsTheTargets(catalog, judgements("/search/demo-judgements.tsv"));
    }

    /** Scores a judged set on a harvested catalog and checks the targets of issue 7 (nDCG@10 ≥ 0.9, first hit ≥ 80 %). */
    static void assertMeetsTheTargets(Catalog catalog, List<Judged> judged) {
        assertThat(judged).hasSizeGreaterThanOrEqualTo(40);
        double sum = 0;
        int firstRelevant = 0;
        StringBuilder report = new StringBuilder();
        for (Judged j : judged) {
            List<String> ranked = catalog.index().search(j.query(), null, 10).stream().map(SearchHit::name).toList();
            double score = ndcg(ranked, j.grades(), 10);
            sum += score;
            boolean first = !ranked.isEmpty() && j.grades().getOrDefault(ranked.get(0), 0) > 0;
            if (first) {
                firstRelevant++;
            }
            report.append(String.format("%.3f %s %-28s %s%n", score, first ? "+" : "-", j.query(),
                    ranked.stream().limit(4).toList()));
        }
        double mean = sum / judged.size();
        double firstShare = (double) firstRelevant / judged.size();
        System.out.printf("nDCG@10 %.3f, first hit relevant %d of %d%n%s", mean, firstRelevant, judged.size(), report);
        // Targets of issue 7.
        assertThat(mean).as(report.toString()).isGreaterThanOrEqualTo(0.9);
        assertThat(firstShare).as(report.toString()).isGreaterThanOrEqualTo(0.8);
    }
}
