package org.headwater.analysis;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.headwater.analysis.script.AnalysisContext;
import org.headwater.analysis.script.ColumnFlow;
import org.headwater.analysis.script.DataReference;
import org.headwater.analysis.script.DatasetFlow;
import org.headwater.analysis.script.Direction;
import org.headwater.analysis.script.ScriptAnalysis;
import org.headwater.analysis.script.WorkspaceAnalysis;
import org.headwater.analysis.sql.ColumnOrigin;
import org.headwater.analysis.sql.ColumnRef;
import org.headwater.analysis.sql.OutputColumn;
import org.headwater.analysis.sql.SchemaLookup;
import org.headwater.analysis.sql.SqlLineageAnalyzer;
import org.headwater.analysis.sql.StatementLineage;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.Reference;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.CatalogReader;
import org.headwater.store.CatalogReader.StaticEdge;
import org.headwater.store.Views.ScriptView;

/**
 * Turns the static analysis of a workspace into observations: each script's references (resolved or
 * not), a static lineage edge from every dataset a script reads to every dataset it writes (with column
 * flows where the code shows them), the tables and views SQL files define, and the end of edges that a
 * script no longer has. References are matched to harvested datasets by exact workspace-relative name,
 * by a partition's name (giving its set), or by glob over those names.
 */
public final class ScriptLineage {
    private final CatalogReader reader;
    private final SqlLineageAnalyzer sql = new SqlLineageAnalyzer();

    public ScriptLineage(CatalogReader reader) {
        this.reader = reader;
    }

    /**
     * The analysis of the given workspace scripts (relative paths in name order). It reads no store, so a
     * harvest runs it while the data files are still being read, and hands it to {@link #observe(Path, long,
     * String, List)} once they are in.
     */
    public static List<ScriptAnalysis> analyse(Path root, List<Path> scripts) {
        return new WorkspaceAnalysis().analyze(root, scripts, AnalysisContext.defaults());
    }

    /**
     * The observations for one harvested folder whose scripts were analysed already.
     *
     * @param names the name and URI of each dataset the source holds, and each partition's name with its set's
     *     URI, as {@link CatalogReader#namesOfSource} reads them: the harvest passes its own account
     */
    public List<Observation> observe(Path root, long sourceId, String sourceName, List<ScriptAnalysis> analyses,
            Map<String, String> names) {
        SuffixIndex suffixes = new SuffixIndex(names);
        Map<String, ScriptView> scripts = new LinkedHashMap<>();
        for (ScriptView s : reader.scripts(0, Integer.MAX_VALUE)) {
            if (s.present() && sourceName.equals(s.source())) {
                scripts.put(s.uri(), s);
            }
        }
        List<Observation> out = new ArrayList<>();
        Set<StaticEdge> now = new HashSet<>();
        for (ScriptAnalysis analysis : analyses) {
            ScriptView script = scripts.get(root.resolve(analysis.script()).toUri().toString());
            if (script != null) {
                scriptObservations(root, names, suffixes, script, analysis, out, now);
            }
        }
        // SQL files in name order; tables one file defines are known to the files after it in the same pass.
        Map<String, List<String>> definedNow = new java.util.HashMap<>();
        for (ScriptView script : scripts.values()) {
            if (script.language().equals("sql")) {
                sqlObservations(root, sourceName, script, out, now, definedNow);
            }
        }
        for (StaticEdge before : reader.staticEdges(sourceId)) {
            if (!now.contains(before)) {
                out.add(new Observation.EdgeGone(before.sourceUri(), before.targetUri(), before.scriptUri(), Evidence.STATIC));
            }
        }
        return out;
    }

    private void scriptObservations(Path root, Map<String, String> names, SuffixIndex suffixes, ScriptView script,
            ScriptAnalysis analysis,
            List<Observation> out, Set<StaticEdge> now) {
        List<Reference> references = new ArrayList<>();
        Map<String, Double> reads = new LinkedHashMap<>();
        Map<String, Double> writes = new LinkedHashMap<>();
        Map<String, List<String>> uriOfPattern = new LinkedHashMap<>();
        for (DataReference r : analysis.references()) {
            List<String> uris = resolve(root, names, suffixes, r);
            uriOfPattern.put(key(r), uris);
            boolean resolved = r.resolved() && !uris.isEmpty();
            references.add(new Reference(r.direction().name().toLowerCase(Locale.ROOT),
                    r.tableName() != null ? r.tableName() : r.pathPattern(), resolved, resolved ? uris.get(0) : null,
                    r.function(), r.expressionText(), r.line(), r.column(), r.cell(), r.confidence()));
            if (!resolved) {
                continue;
            }
            Map<String, Double> side = r.direction() == Direction.READ ? reads : writes;
            for (String uri : uris) {
                side.merge(uri, r.confidence(), Math::max);
            }
        }
        out.add(new Observation.ScriptReferencesSeen(script.uri(), script.contentHash(), references, analysis.warnings()));
        for (Map.Entry<String, Double> w : writes.entrySet()) {
            for (Map.Entry<String, Double> r : reads.entrySet()) {
                // A script that reads a file and rewrites it (a running log) is a cycle: its output depends
                // on the output's previous content, and impact and staleness need that self-edge.
                List<Observation.ColumnFlow> flows = columnFlows(analysis, uriOfPattern, r.getKey(), w.getKey());
                out.add(new EdgeSeen(r.getKey(), w.getKey(), script.uri(), script.contentHash(), null, Evidence.STATIC,
                        Math.min(r.getValue(), w.getValue()), flows));
                now.add(new StaticEdge(r.getKey(), w.getKey(), script.uri()));
            }
        }
    }

    /** Column flows the code shows from one read dataset into one written dataset. */
    private static List<Observation.ColumnFlow> columnFlows(ScriptAnalysis analysis, Map<String, List<String>> uriOfPattern,
            String sourceUri, String targetUri) {
        List<Observation.ColumnFlow> flows = new ArrayList<>();
        for (DatasetFlow flow : analysis.flows()) {
            if (!uriOfPattern.getOrDefault(key(flow.target()), List.of()).contains(targetUri)) {
                continue;
            }
            for (ColumnFlow c : flow.columns()) {
                boolean fromSource = analysis.references().stream()
                        .filter(r -> c.source().equals(r.pathPattern()) || c.source().equals("table:" + r.tableName()))
                        .anyMatch(r -> uriOfPattern.getOrDefault(key(r), List.of()).contains(sourceUri));
                if (fromSource) {
                    flows.add(new Observation.ColumnFlow(c.sourceColumn(), c.targetColumn(),
                            c.derived() ? ColumnRole.DERIVED : ColumnRole.DIRECT));
                }
            }
        }
        return flows;
    }

    private static String key(DataReference r) {
        return r.direction() + "|" + r.pathPattern() + "|" + r.tableName() + "|" + r.line() + "|" + r.column() + "|" + r.cell();
    }

    /** The dataset URIs a reference stands for; empty when it names nothing that can be located. */
    private static List<String> resolve(Path root, Map<String, String> names, SuffixIndex suffixes, DataReference r) {
        Set<String> uris = new LinkedHashSet<>();
        if (r.tableName() != null) {
            return List.of();
        }
        if (r.pathPattern() == null) {
            return List.of();
        }
        List<String> candidates = r.instances().isEmpty() ? List.of(r.pathPattern()) : r.instances();
        for (String pattern : candidates) {
            String name = pattern.replace('\\', '/');
            if (name.startsWith("./")) {
                name = name.substring(2);
            }
            if (names.containsKey(name)) {
                uris.add(names.get(name));
            } else if (name.contains("*") || name.contains("?")) {
                PathMatcher glob = FileSystems.getDefault().getPathMatcher("glob:" + name);
                names.forEach((known, uri) -> {
                    if (glob.matches(Path.of(known))) {
                        uris.add(uri);
                    }
                });
                if (uris.isEmpty() && names.containsKey(name)) {
                    uris.add(names.get(name));
                }
            } else if (!name.contains("://")) {
                String bySuffix = suffixes.uniqueMatch(name);
                // Not harvested (yet): an output the script will write, or a file outside the workspace.
                uris.add(bySuffix != null ? bySuffix : root.resolve(name).normalize().toUri().toString());
            }
        }
        return new ArrayList<>(uris);
    }

    /**
     * The one harvested dataset whose name ends with the path a script names, when the script's idea of
     * its working folder differs from ours (a script run from {@code lab/} reading {@code raw.csv}).
     * Only a unique match counts: two candidates are a guess, and guesses are not made.
     */
    static String uniqueSuffixMatch(Map<String, String> names, String path) {
        String tail = "/" + path.replaceFirst("^(\\.\\./)+", "");
        String found = null;
        for (Map.Entry<String, String> e : names.entrySet()) {
            if (e.getKey().endsWith(tail)) {
                if (found != null && !found.equals(e.getValue())) {
                    return null;
                }
                found = e.getValue();
            }
        }
        return found;
    }

    /**
     * {@link #uniqueSuffixMatch} for many paths against the same names: every name is filed under each of
     * its endings that start after a slash, once, instead of scanning all names for every reference (50,000
     * names times the references of 400 scripts in the synthetic lake).
     */
    static final class SuffixIndex {
        private static final String AMBIGUOUS = "";
        private final Map<String, String> byEnding = new java.util.HashMap<>();

        SuffixIndex(Map<String, String> names) {
            for (Map.Entry<String, String> e : names.entrySet()) {
                String name = e.getKey();
                for (int slash = name.indexOf('/'); slash >= 0; slash = name.indexOf('/', slash + 1)) {
                    byEnding.merge(name.substring(slash + 1), e.getValue(),
                            (a, b) -> a.equals(b) ? a : AMBIGUOUS);
                }
            }
        }

        String uniqueMatch(String path) {
            String found = byEnding.get(path.replaceFirst("^(\\.\\./)+", ""));
            return found == null || found.equals(AMBIGUOUS) ? null : found;
        }
    }

    /** Tables and views defined by a SQL file, with column lineage from the tables they read. */
    private void sqlObservations(Path root, String sourceName, ScriptView script, List<Observation> out,
            Set<StaticEdge> now, Map<String, List<String>> definedNow) {
        String text;
        try {
            text = Files.readString(Path.of(java.net.URI.create(script.uri())), StandardCharsets.UTF_8);
        } catch (IOException | RuntimeException e) {
            return;
        }
        SchemaLookup catalogTables = knownTables(sourceName);
        SchemaLookup known = table -> {
            List<String> fresh = definedNow.get(tableUri(sourceName, table.toString()));
            return fresh != null ? java.util.Optional.of(fresh) : catalogTables.columnsOf(table);
        };
        for (StatementLineage s : sql.analyze(text, known)) {
            if (s.target() == null || s.kind() == StatementLineage.Kind.SELECT || s.kind() == StatementLineage.Kind.UNPARSED) {
                continue;
            }
            String target = tableUri(sourceName, s.target().toString());
            List<ColumnDef> columns = new ArrayList<>();
            for (OutputColumn c : s.columns()) {
                columns.add(new ColumnDef(c.name(), "unknown", true));
            }
            definedNow.put(target, columns.stream().map(ColumnDef::name).toList());
            DatasetKind kind = s.kind() == StatementLineage.Kind.CREATE_VIEW ? DatasetKind.VIEW : DatasetKind.TABLE;
            out.add(new Observation.DatasetSeen(target, s.target().toString(), kind, null, "sql", null, null, null, null,
                    false, null, null, columns));
            Map<String, List<Observation.ColumnFlow>> bySource = new LinkedHashMap<>();
            s.sourceTables().forEach(t -> bySource.put(tableUri(sourceName, t.toString()), new ArrayList<>()));
            for (OutputColumn c : s.columns()) {
                for (ColumnOrigin o : c.origins()) {
                    bySource.computeIfAbsent(tableUri(sourceName, o.source().table().toString()), k -> new ArrayList<>())
                            .add(new Observation.ColumnFlow(o.source().column(), c.name(),
                                    o.derived() ? ColumnRole.DERIVED : ColumnRole.DIRECT));
                }
            }
            for (ColumnRef i : s.influencing()) {
                bySource.computeIfAbsent(tableUri(sourceName, i.table().toString()), k -> new ArrayList<>())
                        .add(new Observation.ColumnFlow(i.column(), null, ColumnRole.INFLUENCING));
            }
            for (Map.Entry<String, List<Observation.ColumnFlow>> e : bySource.entrySet()) {
                if (e.getKey().equals(target)) {
                    continue;
                }
                out.add(new EdgeSeen(e.getKey(), target, script.uri(), script.contentHash(), null, Evidence.STATIC, 1.0,
                        e.getValue()));
                now.add(new StaticEdge(e.getKey(), target, script.uri()));
            }
        }
    }

    /** The columns of tables and views the catalog already holds for this source, so that {@code *} expands. */
    private SchemaLookup knownTables(String sourceName) {
        return table -> reader.findDatasets(tableUri(sourceName, table.toString())).stream()
                .filter(d -> d.uri().equals(tableUri(sourceName, table.toString())))
                .findFirst()
                .flatMap(d -> reader.dataset(d.id(), null))
                .filter(d -> !d.columns().isEmpty())
                .map(d -> d.columns().stream().map(c -> c.name()).toList());
    }

    /** Tables named in SQL files, known to the catalog without a database: {@code sqltable:SOURCE/NAME}. */
    static String tableUri(String sourceName, String qualified) {
        return "sqltable:" + sourceName + "/" + qualified.toLowerCase(Locale.ROOT);
    }

}
