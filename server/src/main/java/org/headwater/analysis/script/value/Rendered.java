package org.headwater.analysis.script.value;

import java.util.ArrayList;
import java.util.List;
import org.headwater.analysis.script.value.Piece.Gap;
import org.headwater.analysis.script.value.Piece.Hole;
import org.headwater.analysis.script.value.Piece.Lit;

/**
 * A text value written out as a path pattern.
 *
 * @param pattern holes and gaps written as their glob ({@code *} for gaps)
 * @param glob whether the pattern stands for several paths
 * @param complete whether no part is unknown
 * @param instances every path the pattern stands for, when all holes are enumerable (at most {@link #MAX_INSTANCES})
 */
public record Rendered(String pattern, boolean glob, boolean complete, List<String> instances) {
    public static final int MAX_INSTANCES = 256;

    public static Rendered of(Value.Text text) {
        StringBuilder pattern = new StringBuilder();
        boolean glob = false;
        boolean complete = true;
        List<String> instances = new ArrayList<>(List.of(""));
        for (Piece p : text.pieces()) {
            if (p instanceof Lit lit) {
                pattern.append(lit.text());
                // a literal star is a pattern the called function expands (glob.glob, polars): no instances known
                boolean wild = lit.text().contains("*") || lit.text().contains("?");
                glob |= wild;
                instances = wild ? null : append(instances, List.of(lit.text()));
            } else if (p instanceof Hole hole) {
                pattern.append(hole.glob() == null ? "*" : hole.glob());
                glob = true;
                // a loop over values the code does not show: the star is a shape, not a known pattern
                complete &= hole.values() != null || hole.glob() != null;
                instances = hole.values() == null ? null : append(instances, hole.values());
            } else if (p instanceof Gap) {
                pattern.append('*');
                complete = false;
                instances = null;
            }
        }
        List<String> enumerated = glob && instances != null ? List.copyOf(instances) : List.of();
        return new Rendered(pattern.toString(), glob, complete, enumerated);
    }

    private static List<String> append(List<String> prefixes, List<String> tails) {
        if (prefixes == null || prefixes.size() * tails.size() > MAX_INSTANCES) {
            return null;
        }
        List<String> out = new ArrayList<>();
        for (String prefix : prefixes) {
            for (String tail : tails) {
                out.add(prefix + tail);
            }
        }
        return out;
    }
}
