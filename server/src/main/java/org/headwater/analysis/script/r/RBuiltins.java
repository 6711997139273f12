package org.headwater.analysis.script.r;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import org.headwater.analysis.script.eval.Findings;
import org.headwater.analysis.script.eval.ReferenceMaker;
import org.headwater.analysis.script.eval.Scope;
import org.headwater.analysis.script.io.CallArgs;
import org.headwater.analysis.script.syntax.Grammar;
import org.headwater.analysis.script.syntax.Parsing;
import org.headwater.analysis.script.value.PathText;
import org.headwater.analysis.script.value.Rendered;
import org.headwater.analysis.script.value.Value;
import org.headwater.analysis.script.value.Value.Text;
import org.headwater.analysis.script.value.Values;

/**
 * The R functions whose results matter for paths, as a table from name to what they give.
 * // reference: R documentation of file.path, paste, paste0, sprintf, commandArgs, list.files,
 * Sys.glob, Sys.getenv, seq, and here::here (the project root), from memory
 */
final class RBuiltins {
    /** One builtin. */
    interface Builtin {
        Value apply(CallArgs args, REvaluator ev);
    }

    private static final Map<String, Builtin> TABLE = new LinkedHashMap<>();

    static {
        TABLE.put("file.path", (a, ev) -> vectorised(positional(a), parts -> join(parts, Values.lit(sep(a, "fsep", "/")))));
        TABLE.put("paste0", (a, ev) -> vectorised(positional(a), parts -> join(parts, Values.lit(""))));
        TABLE.put("paste", (a, ev) -> vectorised(positional(a), parts -> join(parts, Values.lit(sep(a, "sep", " ")))));
        TABLE.put("sprintf", (a, ev) -> sprintf(a));
        TABLE.put("here", (a, ev) -> vectorised(positional(a), parts -> {
            List<Text> all = new ArrayList<>();
            all.add(Values.lit(ev.run().workspaceRoot().toString()));
            parts.forEach(p -> all.add(RCalls.text(p)));
            return PathText.join(all);
        }));
        TABLE.put("normalizePath", (a, ev) -> first(a));
        TABLE.put("path.expand", (a, ev) -> first(a));
        TABLE.put("dirname", (a, ev) -> Values.lift1(first(a), v -> PathText.parent(RCalls.text(v)).<Value>map(t -> t).orElse(new Value.Unknown("dirname"))));
        TABLE.put("basename", (a, ev) -> Values.lift1(first(a), v -> PathText.name(RCalls.text(v)).<Value>map(t -> t).orElse(new Value.Unknown("basename"))));
        TABLE.put("getwd", (a, ev) -> Values.lit(ev.run().workingDir().toString()));
        TABLE.put("Sys.getenv", (a, ev) -> {
            String name = a.at(0).flatMap(x -> Values.constant(x.value())).orElse("?");
            Value env = new Value.Unknown("environment variable " + name);
            return a.named("unset").map(u -> Values.oneOf(List.of(env, u.value()))).orElse(env);
        });
        TABLE.put("commandArgs", (a, ev) -> commandArgs(a, ev));
        TABLE.put("c", (a, ev) -> collect(a));
        TABLE.put("list", (a, ev) -> collect(a));
        TABLE.put("seq_len", (a, ev) -> a.at(0).map(x -> x.value() instanceof Value.Num n ? RCalls.binary(":", new Value.Num(1, true), n)
                : (Value) new Value.Unknown("seq_len")).orElse(new Value.Unknown("seq_len")));
        TABLE.put("seq", (a, ev) -> a.at(0).flatMap(x -> a.at(1).or(() -> a.named("to")).map(y -> RCalls.binary(":", x.value(), y.value())))
                .orElse(new Value.Unknown("seq")));
        TABLE.put("length", (a, ev) -> a.at(0).map(x -> x.value() instanceof Value.Items it ? (Value) new Value.Num(it.items().size(), true)
                : new Value.Unknown("length")).orElse(new Value.Unknown("length")));
        TABLE.put("as.character", (a, ev) -> Values.lift1(first(a), RCalls::text));
        TABLE.put("toString", TABLE.get("as.character"));
        TABLE.put("list.files", (a, ev) -> listFiles(a));
        TABLE.put("dir", (a, ev) -> listFiles(a));
        TABLE.put("Sys.glob", (a, ev) -> Values.lift1(first(a), v -> {
            Rendered r = Rendered.of(RCalls.text(v));
            return r.complete() ? new Value.Each(null, r.pattern()) : Value.unknownItem();
        }));
        TABLE.put("ifelse", (a, ev) -> {
            Optional<Boolean> t = a.at(0).flatMap(x -> Values.truth(x.value()));
            Value yes = a.at(1).map(CallArgs.Arg::value).orElse(new Value.Nothing());
            Value no = a.at(2).map(CallArgs.Arg::value).orElse(new Value.Nothing());
            return t.map(b -> b ? yes : no).orElse(Values.oneOf(List.of(yes, no)));
        });
        TABLE.put("glue", (a, ev) -> new Value.Unknown("glue template"));
        for (String passOn : List.of("invisible", "suppressWarnings", "suppressMessages", "suppressPackageStartupMessages",
                "local", "tryCatch", "try", "withCallingHandlers", "force", "identity", "I")) {
            TABLE.put(passOn, (a, ev) -> first(a));
        }
        for (String nothing : List.of("print", "cat", "message", "warning", "stop", "stopifnot", "dev.off", "on.exit",
                "set.seed", "options", "rm", "dir.create", "setwd")) {
            TABLE.put(nothing, (a, ev) -> new Value.Nothing());
        }
    }

    private RBuiltins() {
    }

    static Optional<Builtin> find(String name) {
        return Optional.ofNullable(TABLE.get(name));
    }

    private static List<Value> positional(CallArgs a) {
        return a.positional().stream().map(CallArgs.Arg::value).toList();
    }

    private static Value first(CallArgs a) {
        return a.at(0).map(CallArgs.Arg::value).orElse(new Value.Nothing());
    }

    private static String sep(CallArgs a, String name, String otherwise) {
        return a.named(name).flatMap(x -> Values.constant(x.value())).orElse(otherwise);
    }

    private static Text join(List<Value> parts, Text sep) {
        List<Text> out = new ArrayList<>();
        for (int i = 0; i < parts.size(); i++) {
            if (i > 0) {
                out.add(sep);
            }
            out.add(RCalls.text(parts.get(i)));
        }
        return Values.concat(out);
    }

    /** R functions work element by element over vectors, recycling the shorter ones. */
    private static Value vectorised(List<Value> args, Function<List<Value>, Value> op) {
        int n = 1;
        for (Value v : args) {
            if (v instanceof Value.Items it) {
                if (it.items().isEmpty()) {
                    return new Value.Items(List.of());
                }
                n = Math.max(n, it.items().size());
            }
        }
        if (n == 1) {
            List<Value> scalars = args.stream().map(v -> v instanceof Value.Items it ? it.items().get(0) : v).toList();
            return Values.lift(scalars, op);
        }
        List<Value> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            List<Value> row = new ArrayList<>();
            for (Value v : args) {
                row.add(v instanceof Value.Items it ? it.items().get(i % it.items().size()) : v);
            }
            out.add(Values.lift(row, op));
        }
        return new Value.Items(out);
    }

    private static Value sprintf(CallArgs a) {
        Optional<String> fmt = a.at(0).or(() -> a.named("fmt")).flatMap(x -> Values.constant(x.value()));
        if (fmt.isEmpty()) {
            return new Value.Unknown("sprintf format not known");
        }
        List<Value> rest = a.positional().size() > 1 ? positional(a).subList(1, a.positional().size()) : List.of();
        return vectorised(rest, vs -> RStrings.sprintf(fmt.get(), vs));
    }

    private static Value commandArgs(CallArgs a, REvaluator ev) {
        boolean trailing = a.named("trailingOnly").or(() -> a.at(0)).flatMap(x -> Values.truth(x.value())).orElse(false);
        if (!trailing) {
            return new Value.Unknown("commandArgs() without trailingOnly also holds R's own arguments");
        }
        List<String> argv = ev.run().argv();
        if (argv == null) {
            return new Value.Unknown(ReferenceMaker.NO_ARGUMENT + " (commandArgs)");
        }
        List<Value> items = new ArrayList<>();
        argv.forEach(s -> items.add(s == null ? new Value.Unknown("argument computed by the driver") : Values.lit(s)));
        return new Value.Items(items);
    }

    private static Value collect(CallArgs a) {
        if (!a.named().isEmpty() && a.positional().isEmpty()) {
            Map<String, Value> out = new LinkedHashMap<>();
            a.named().forEach((k, v) -> out.put(k, v.value()));
            return new Value.Dict(out);
        }
        List<Value> out = new ArrayList<>();
        for (CallArgs.Arg x : a.positional()) {
            if (x.value() instanceof Value.Items it) {
                out.addAll(it.items());
            } else {
                out.add(x.value());
            }
        }
        a.named().values().forEach(x -> out.add(x.value()));
        return new Value.Items(out);
    }

    private static Value listFiles(CallArgs a) {
        Value dir = a.at(0).or(() -> a.named("path")).map(CallArgs.Arg::value).orElse(Values.lit("."));
        boolean full = a.named("full.names").flatMap(x -> Values.truth(x.value())).orElse(false);
        if (!full) {
            return Value.unknownItemOfListing();
        }
        return Values.lift1(dir, d -> {
            Rendered r = Rendered.of(PathText.join(List.of(RCalls.text(d), Values.lit("*"))));
            return r.complete() ? new Value.Each(null, r.pattern()) : Value.unknownItem();
        });
    }

    /**
     * {@code source("helpers.R")}: the sourced file's top level runs in this environment, so its
     * variables and functions become known; what it reads belongs to its own analysis.
     */
    static Value source(CallArgs a, REvaluator ev, Scope scope) {
        Optional<String> file = a.at(0).flatMap(x -> Values.constant(x.value()));
        if (file.isEmpty()) {
            return new Value.Nothing();
        }
        Path abs = ev.run().workingDir().resolve(file.get()).normalize();
        if (!abs.startsWith(ev.run().workspaceRoot()) || !Files.isRegularFile(abs)) {
            ev.findings().warn("sourced file " + file.get() + " is not in the workspace");
            return new Value.Nothing();
        }
        try {
            String code = Files.readString(abs, StandardCharsets.UTF_8);
            REvaluator inner = new REvaluator(ev.run().forModule(ev.run().workspaceRoot().relativize(abs)), new Findings());
            inner.eval(Parsing.parse(Grammar.R, code), inner.globals());
            inner.globals().variables().forEach(scope::set);
        } catch (IOException e) {
            ev.findings().warn("sourced file " + file.get() + " could not be read: " + e.getMessage());
        }
        return new Value.Nothing();
    }
}
