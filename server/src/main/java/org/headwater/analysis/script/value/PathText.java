package org.headwater.analysis.script.value;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.headwater.analysis.script.value.Value.Text;

/** Path operations on text values that may hold holes: join, parent, name. */
public final class PathText {
    private PathText() {
    }

    /** Joins parts with {@code /}; an absolute part starts over. // reference: Python 3 os.path.join */
    public static Text join(List<Text> parts) {
        Text out = null;
        for (Text part : parts) {
            Optional<String> first = firstLiteral(part);
            if (out == null || first.map(s -> s.startsWith("/")).orElse(false)) {
                out = part;
            } else if (endsWithSlash(out) || isEmpty(out)) {
                out = Values.concat(out, part);
            } else {
                out = Values.concat(List.of(out, Values.lit("/"), part));
            }
        }
        return out == null ? Values.lit("") : out;
    }

    /** Everything before the last {@code /}; empty when there is none. // reference: Python 3 os.path.dirname */
    public static Optional<Text> parent(Text t) {
        List<Piece> pieces = t.pieces();
        for (int i = pieces.size() - 1; i >= 0; i--) {
            Piece p = pieces.get(i);
            if (p instanceof Piece.Gap) {
                return Optional.empty();
            }
            if (p instanceof Piece.Lit lit) {
                String s = stripTrailing(lit.text(), i == pieces.size() - 1);
                int cut = s.lastIndexOf('/');
                if (cut >= 0) {
                    List<Piece> head = new ArrayList<>(pieces.subList(0, i));
                    head.add(new Piece.Lit(cut == 0 ? "/" : s.substring(0, cut)));
                    return Optional.of(new Text(head));
                }
            }
        }
        return Optional.of(Values.lit(""));
    }

    /** The last part after {@code /}. */
    public static Optional<Text> name(Text t) {
        List<Piece> pieces = t.pieces();
        for (int i = pieces.size() - 1; i >= 0; i--) {
            if (pieces.get(i) instanceof Piece.Gap) {
                return Optional.empty();
            }
            if (pieces.get(i) instanceof Piece.Lit lit) {
                int cut = lit.text().lastIndexOf('/');
                if (cut >= 0) {
                    List<Piece> tail = new ArrayList<>();
                    tail.add(new Piece.Lit(lit.text().substring(cut + 1)));
                    tail.addAll(pieces.subList(i + 1, pieces.size()));
                    return Optional.of(new Text(tail));
                }
            }
        }
        return Optional.of(t);
    }

    /** The path with its last suffix replaced. */
    public static Optional<Text> withSuffix(Text t, String suffix) {
        Optional<String> whole = Values.constant(t);
        if (whole.isEmpty()) {
            return Optional.empty();
        }
        String s = whole.get();
        int slash = s.lastIndexOf('/');
        int dot = s.lastIndexOf('.');
        String stem = dot > slash + 1 ? s.substring(0, dot) : s;
        return Optional.of(Values.lit(stem + suffix));
    }

    private static String stripTrailing(String s, boolean last) {
        return last && s.length() > 1 && s.endsWith("/") ? s.substring(0, s.length() - 1) : s;
    }

    private static Optional<String> firstLiteral(Text t) {
        return !t.pieces().isEmpty() && t.pieces().get(0) instanceof Piece.Lit lit ? Optional.of(lit.text()) : Optional.empty();
    }

    private static boolean endsWithSlash(Text t) {
        List<Piece> p = t.pieces();
        return !p.isEmpty() && p.get(p.size() - 1) instanceof Piece.Lit lit && lit.text().endsWith("/");
    }

    private static boolean isEmpty(Text t) {
        return t.pieces().isEmpty();
    }
}
