package org.headwater.search;

import java.util.List;

/**
 * Why a hit ranked where it did: its score is {@code text × factor}, where text is the BM25 relevance of the
 * words (plus 1000 for an exact name), and factor combines the kind of thing, its use and its centrality.
 *
 * @param mode {@code all words} or {@code any word} (the fallback when no document has all the words)
 * @param text the text score
 * @param exactName whether the whole query equals the name (or the file name without extension)
 * @param uses reads of the dataset by scripts' current code and by reported runs
 * @param centrality the dataset's PageRank over the lineage graph times the number of datasets in it (1 = average)
 * @param factor what kind, uses and centrality multiply the text score by
 * @param matched the fields and terms that matched, as {@code field:term}
 */
public record HitExplanation(String mode, double text, boolean exactName, int uses, double centrality, double factor,
        List<String> matched) {
}
