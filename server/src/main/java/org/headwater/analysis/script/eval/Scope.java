package org.headwater.analysis.script.eval;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Values;

/** Variables of one function call or module, with the enclosing scope to look further in. */
public final class Scope {
    private final Map<String, Value> vars;
    private final Scope parent;
    private final Set<String> globals;

    public Scope(Scope parent) {
        this(new HashMap<>(), parent, new HashSet<>());
    }

    private Scope(Map<String, Value> vars, Scope parent, Set<String> globals) {
        this.vars = vars;
        this.parent = parent;
        this.globals = globals;
    }

    public Optional<Value> lookup(String name) {
        if (vars.containsKey(name)) {
            return Optional.of(vars.get(name));
        }
        return parent == null ? Optional.empty() : parent.lookup(name);
    }

    public Optional<Value> local(String name) {
        return Optional.ofNullable(vars.get(name));
    }

    public void set(String name, Value value) {
        if (globals.contains(name) && parent != null) {
            outermost().set(name, value);
            return;
        }
        vars.put(name, value);
    }

    /** Sets a variable in the scope that already holds it (R's {@code <<-}), else in the outermost one. */
    public void setOuter(String name, Value value) {
        Scope s = parent;
        while (s != null) {
            if (s.vars.containsKey(name) || s.parent == null) {
                s.vars.put(name, value);
                return;
            }
            s = s.parent;
        }
        vars.put(name, value);
    }

    public void declareGlobal(String name) {
        globals.add(name);
    }

    public Scope outermost() {
        return parent == null ? this : parent.outermost();
    }

    public Map<String, Value> variables() {
        return java.util.Collections.unmodifiableMap(vars);
    }

    /** A copy for one branch of an if whose condition is unknown. */
    public Scope fork() {
        return new Scope(new HashMap<>(vars), parent, new HashSet<>(globals));
    }

    /**
     * Takes the branches back in: a variable the branches set differently becomes a choice.
     *
     * @param fallThrough whether control may also skip every branch (an if without else)
     */
    public void join(List<Scope> branches, boolean fallThrough) {
        Set<String> names = new LinkedHashSet<>();
        branches.forEach(b -> names.addAll(b.vars.keySet()));
        for (String name : names) {
            List<Value> options = new ArrayList<>();
            Value before = vars.get(name);
            for (Scope b : branches) {
                Value v = b.vars.get(name);
                if (v != null) {
                    options.add(v);
                } else if (before != null) {
                    options.add(before);
                }
            }
            if (fallThrough && before != null) {
                options.add(before);
            }
            vars.put(name, Values.oneOf(options));
        }
    }
}
