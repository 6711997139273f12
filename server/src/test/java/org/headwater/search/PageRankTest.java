package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.jgrapht.Graph;
import org.jgrapht.alg.scoring.PageRank;
import org.jgrapht.graph.DefaultEdge;
import org.jgrapht.graph.SimpleDirectedGraph;
import org.junit.jupiter.api.Test;

class PageRankTest {

    @Test
    void ranksOfARandomGraphWithDanglingNodesEqualThoseOfJGraphT() {
        // A generated graph: 300 nodes, about 1,200 edges, with nodes that have no out-links and nodes with none in.
        Random random = new Random(20261202);
        int n = 300;
        Graph<Integer, DefaultEdge> reference = new SimpleDirectedGraph<>(DefaultEdge.class);
        for (int v = 0; v < n; v++) {
            reference.addVertex(v);
        }
        List<int[]> edges = new ArrayList<>();
        for (int i = 0; i < 1200; i++) {
            int from = random.nextInt(n);
            int to = random.nextInt(n);
            // Nodes 250 and above never link out: dangling, like final outputs in a lineage graph.
            if (from != to && from < 250 && reference.addEdge(from, to) != null) {
                edges.add(new int[] {from, to});
            }
        }
        int[] from = edges.stream().mapToInt(e -> e[0]).toArray();
        int[] to = edges.stream().mapToInt(e -> e[1]).toArray();

        double[] ours = org.headwater.search.PageRank.of(n, from, to);

        // expected: JGraphT 1.5.3 (org.jgrapht:jgrapht-core, Maven Central), PageRank with the same damping 0.85.
        PageRank<Integer, DefaultEdge> theirs = new PageRank<>(reference, 0.85, 1000, 1e-12);
        double sum = 0;
        for (int v = 0; v < n; v++) {
            assertThat(ours[v]).as("node %d", v).isCloseTo(theirs.getVertexScore(v), within(1e-9));
            sum += ours[v];
        }
        assertThat(sum).isCloseTo(1.0, within(1e-9));
    }

    @Test
    void aStarOfSourcesGivesTheHubTheLargestRank() {
        // Page, Brin, Motwani and Winograd 1999: a page many pages link to ranks highest. Three derived datasets
        // point at the source they were made from (0); 0 has no out-link.
        double[] ranks = org.headwater.search.PageRank.of(4, new int[] {1, 2, 3}, new int[] {0, 0, 0});
        // expected, solved by hand from the PageRank equations with damping d = 0.85 and the dangling hub's rank
        // spread over all 4 nodes: each leaf r = (1 - d)/4 + d·r0/4, and r0 = r + 3·d·r = 3.55·r;
        // so 4r = 0.15 + 0.85 · 3.55 r, r = 0.15 / 0.9825 = 0.152672 and r0 = 0.541985.
        assertThat(ranks[0]).isCloseTo(0.541985, within(1e-6));
        assertThat(ranks[1]).isCloseTo(0.152672, within(1e-6));
        assertThat(ranks[3]).isCloseTo(ranks[1], within(1e-12));
    }
}
