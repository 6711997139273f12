package org.headwater.analysis.script.value;

import java.util.List;

/** A part of a text value. */
public sealed interface Piece {

    /** Text known exactly. */
    record Lit(String text) implements Piece {
    }

    /**
     * A loop variable written into the text: {@code glob} stands for it in a pattern ({@code null} for a
     * loop over values the code does not show, written {@code *} but not a known pattern), and
     * {@code values} lists what it takes when the loop is literal, or is {@code null}.
     */
    record Hole(String glob, List<String> values) implements Piece {
        public Hole {
            values = values == null ? null : List.copyOf(values);
        }
    }

    /** A part that cannot be known; the text is then an unresolved reference. */
    record Gap(String why) implements Piece {
    }
}
