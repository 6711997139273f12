package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import org.apache.lucene.index.DirectoryReader;
import org.apache.lucene.index.FieldInfo;
import org.apache.lucene.index.IndexWriter;
import org.apache.lucene.index.IndexWriterConfig;
import org.apache.lucene.index.LeafReader;
import org.apache.lucene.index.NumericDocValues;
import org.apache.lucene.index.PostingsEnum;
import org.apache.lucene.index.Terms;
import org.apache.lucene.index.TermsEnum;
import org.apache.lucene.search.DocIdSetIterator;
import org.apache.lucene.store.ByteBuffersDirectory;
import org.apache.lucene.util.BytesRef;
import org.headwater.store.SearchSource;
import org.headwater.store.Views;
import org.junit.jupiter.api.Test;

class RepeatedTokensTest {

    @Test
    void columnDocumentsWithReplayedTokensIndexExactlyAsTheAnalyzerIndexesThem() throws Exception {
        // expected postings, positions, offsets and norms: Lucene's own indexing of the same documents through
        // the per-field analyzer (IndexWriter with Documents.indexAnalyzer()); the texts are invented and repeat
        // on purpose: names across datasets, one dataset's name for each of its columns, a long name over the cap.
        List<SearchSource.DatasetDoc> datasets = new ArrayList<>();
        String[] names = {"north_station/nitrate_clean_2024.csv", "Ridge-Gauge.Flow raw.tsv",
            "marsh_core/sedimentC_monthly_07.parquet", "x".repeat(RepeatedTokens.MAX_TEXT + 5) + "_long.csv"};
        String[][] columns = {{"site_id", "nitrateMgL", "sampled_on"}, {"site_id", "flow_m3_s", "Ümlaut_Ärger"},
            {"depth2m", "site_id", "sampled_on", "nitrateMgL"}, {"site_id", "a.b.c"}};
        for (int d = 0; d < names.length; d++) {
            List<Views.ColumnView> cols = new ArrayList<>();
            for (int c = 0; c < columns[d].length; c++) {
                cols.add(new Views.ColumnView(c, columns[d][c], c % 2 == 0 ? "string" : "double precision", true));
            }
            datasets.add(new SearchSource.DatasetDoc(new Views.IndexEntry("file", d + 1, "file:///lake/" + names[d],
                    names[d], "csv", "lake", List.of(), null, List.of("qc"), List.of()), cols, List.of(), List.of(),
                    List.of()));
        }
        RepeatedTokens repeated = new RepeatedTokens(Documents.indexAnalyzer());
        try (ByteBuffersDirectory plain = index(datasets, null); ByteBuffersDirectory replayed = index(datasets, repeated);
                DirectoryReader a = DirectoryReader.open(plain); DirectoryReader b = DirectoryReader.open(replayed)) {
            LeafReader left = a.leaves().get(0).reader();
            LeafReader right = b.leaves().get(0).reader();
            assertThat(right.maxDoc()).isEqualTo(left.maxDoc()).isEqualTo(3 + 3 + 4 + 2);
            List<String> fields = new ArrayList<>();
            for (FieldInfo info : left.getFieldInfos()) {
                fields.add(info.name);
                assertThat(right.getFieldInfos().fieldInfo(info.name).getIndexOptions()).as(info.name)
                        .isEqualTo(info.getIndexOptions());
                assertThat(postings(right, info.name)).as(info.name).isEqualTo(postings(left, info.name));
                assertThat(norms(right, info.name)).as(info.name).isEqualTo(norms(left, info.name));
            }
            assertThat(fields).contains("name", "stems", Documents.IN_DATASET, "type", "kind_words");
            for (int doc = 0; doc < left.maxDoc(); doc++) {
                assertThat(right.storedFields().document(doc).toString())
                        .isEqualTo(left.storedFields().document(doc).toString());
            }
        }
    }

    private static ByteBuffersDirectory index(List<SearchSource.DatasetDoc> datasets, RepeatedTokens tokens)
            throws Exception {
        ByteBuffersDirectory dir = new ByteBuffersDirectory();
        try (IndexWriter writer = new IndexWriter(dir, new IndexWriterConfig(Documents.indexAnalyzer()))) {
            for (SearchSource.DatasetDoc d : datasets) {
                for (Views.ColumnView c : d.columns()) {
                    writer.addDocument(Documents.FACETS_CONFIG.build(Documents.column(d, c, tokens)));
                }
            }
            writer.forceMerge(1);
        }
        return dir;
    }

    /** Every term of the field with, per document, its frequency, positions and offsets. */
    private static List<String> postings(LeafReader reader, String field) throws Exception {
        List<String> out = new ArrayList<>();
        Terms terms = reader.terms(field);
        if (terms == null) {
            return out;
        }
        TermsEnum te = terms.iterator();
        for (BytesRef term = te.next(); term != null; term = te.next()) {
            PostingsEnum pe = te.postings(null, PostingsEnum.ALL);
            StringBuilder b = new StringBuilder(term.utf8ToString());
            for (int doc = pe.nextDoc(); doc != DocIdSetIterator.NO_MORE_DOCS; doc = pe.nextDoc()) {
                b.append(" | ").append(doc).append(" x").append(pe.freq());
                for (int i = 0; i < pe.freq(); i++) {
                    b.append(' ').append(pe.nextPosition()).append('@').append(pe.startOffset()).append('-')
                            .append(pe.endOffset());
                }
            }
            out.add(b.toString());
        }
        return out;
    }

    private static List<Long> norms(LeafReader reader, String field) throws Exception {
        List<Long> out = new ArrayList<>();
        NumericDocValues norms = reader.getNormValues(field);
        if (norms == null) {
            return out;
        }
        for (int doc = norms.nextDoc(); doc != DocIdSetIterator.NO_MORE_DOCS; doc = norms.nextDoc()) {
            out.add((long) doc << 32 | (norms.longValue() & 0xffffffffL));
        }
        return out;
    }
}
