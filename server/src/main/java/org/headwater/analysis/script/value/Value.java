package org.headwater.analysis.script.value;

import java.util.List;
import java.util.Map;
import java.util.Objects;

/** What an expression is known to be, as far as reading the code tells. */
public sealed interface Value {

    /** A string, possibly with holes (loop variables) or gaps (unknown parts). */
    record Text(List<Piece> pieces) implements Value {
        public Text {
            pieces = List.copyOf(pieces);
        }
    }

    /** A path object (Python pathlib): a text that also answers path methods and the / operator. */
    record PathValue(Text text) implements Value {
    }

    /** A number; {@code integral} keeps Python's int/float distinction for formatting. */
    record Num(double value, boolean integral) implements Value {
    }

    /** True or false. */
    record Bool(boolean value) implements Value {
    }

    /** Python None, R NULL. */
    record Nothing() implements Value {
    }

    /** A list, tuple or R vector whose items are known one by one. */
    record Items(List<Value> items) implements Value {
        public Items {
            items = List.copyOf(items);
        }
    }

    /** A dictionary or R named list with text keys. */
    record Dict(Map<String, Value> entries) implements Value {
        public Dict {
            entries = Map.copyOf(entries);
        }
    }

    /** A module, function or class known by its qualified name, for example {@code pandas.read_csv}. */
    record Name(String qualified) implements Value {
    }

    /** An object of a tracked type; the state (a data frame's columns, an argument parser) is the evaluator's. */
    record Obj(String type, Object state) implements Value {
        public Obj {
            Objects.requireNonNull(type, "type");
        }
    }

    /**
     * One item of a collection the code loops over. With {@code values} known the loop is literal and
     * can be enumerated; {@code glob} is how the item is written into a path pattern: {@code *} for a
     * directory listing, the pattern of a glob call, {@code null} when nothing is known of the items.
     */
    record Each(List<Value> values, String glob) implements Value {
        public Each {
            values = values == null ? null : List.copyOf(values);
        }
    }

    /** One of several values, as after an if/else whose condition is not known. */
    record OneOf(List<Value> options) implements Value {
        public OneOf {
            options = List.copyOf(options);
        }
    }

    /** Something the analysis cannot know, with the reason people will read. */
    record Unknown(String why) implements Value {
    }

    /** An item of a collection the code does not show. */
    static Each unknownItem() {
        return new Each(null, null);
    }

    /** An entry of a directory listing: any name, a pattern that is known. */
    static Each unknownItemOfListing() {
        return new Each(null, "*");
    }

    static Value text(String literal) {
        return new Text(List.of(new Piece.Lit(literal)));
    }

    static Value unknown(String why) {
        return new Unknown(why);
    }
}
