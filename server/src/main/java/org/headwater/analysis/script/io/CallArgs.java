package org.headwater.analysis.script.io;

import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.analysis.script.syntax.Node;
import org.headwater.analysis.script.value.Value;

/**
 * A call's evaluated arguments.
 *
 * @param splat whether a {@code *args} or {@code **kwargs} argument hides some of them
 */
public record CallArgs(List<Arg> positional, Map<String, Arg> named, boolean splat) {
    public CallArgs {
        positional = List.copyOf(positional);
        named = Map.copyOf(named);
    }

    /** One argument: its value and the code it was written as. */
    public record Arg(Value value, Node node) {
    }

    public Optional<Arg> named(String name) {
        return Optional.ofNullable(named.get(name));
    }

    /** The positional argument at an index, if given. */
    public Optional<Arg> at(int index) {
        return index < positional.size() ? Optional.of(positional.get(index)) : Optional.empty();
    }

    /**
     * The argument bound to a parameter: by name first, else by position among the parameters not
     * named. Python forbids a positional argument after a named one, R allows it, so this one rule
     * serves both. // reference: R Language Definition, 4.3.2 argument matching (exact names, then
     * positions); partial name matching is not followed.
     */
    public Optional<Arg> bind(List<String> params, String param) {
        if (named.containsKey(param)) {
            return Optional.of(named.get(param));
        }
        int position = 0;
        for (String p : params) {
            if (p.equals("...")) {
                return Optional.empty();
            }
            if (named.containsKey(p)) {
                continue;
            }
            if (p.equals(param)) {
                return at(position);
            }
            position++;
        }
        return Optional.empty();
    }
}
