package org.headwater.harvest.jdbc;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Properties;
import java.util.Set;
import java.util.TreeMap;
import java.util.function.Function;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Json;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.EdgeGone;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.NoteSet;
import org.headwater.ingest.Sources;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.CatalogReader;
import org.headwater.store.CatalogReader.CurrentNote;
import org.headwater.store.CatalogReader.StaticEdge;
import org.headwater.store.Views.HarvestErrorView;

/**
 * Harvests one database over JDBC into the catalog. The whole structure is read first, on one read-only
 * connection, and then applied as a single batch: a database that cannot be reached, or that fails halfway
 * through the reading, changes nothing in the catalog. A schema the user may not read is reported and
 * left as it was; the others are harvested. Unchanged tables produce no changes (the ingestor compares),
 * tables that are gone end their validity.
 *
 * <p>URIs: {@code db:SOURCE/SCHEMA.TABLE}, with the source's registered name and the database's own
 * spelling of schema and table.
 */
public final class DatabaseHarvester {
    /** Who a table comment's description note is written by; a note by anyone else is never overwritten. */
    public static final String COMMENT_AUTHOR = "database comment";
    private static final int ERRORS_IN_SUMMARY = 50;

    private final Ingestor ingestor;
    private final Sources sources;
    private final HarvestJournal journal;
    private final CatalogReader reader;
    private final Function<String, String> environment;

    public DatabaseHarvester(Ingestor ingestor, Sources sources, HarvestJournal journal, CatalogReader reader) {
        this(ingestor, sources, journal, reader, System::getenv);
    }

    /** @param environment looks up environment variables (the password's variable); tests pass their own */
    public DatabaseHarvester(Ingestor ingestor, Sources sources, HarvestJournal journal, CatalogReader reader,
            Function<String, String> environment) {
        this.ingestor = ingestor;
        this.sources = sources;
        this.journal = journal;
        this.reader = reader;
        this.environment = environment;
    }

    /** The URI of a table or view of a source. */
    public static String uri(String sourceName, String schema, String table) {
        return "db:" + sourceName + "/" + schema + "." + table;
    }

    /**
     * Harvests the database; never throws for a database problem: an unreachable server, a refused login
     * or a failed read gives a summary with status {@code failed} and the reason, and the catalog unchanged.
     */
    public HarvestSummary harvest(DatabaseSource source, HarvestProgress progress) {
        long started = System.nanoTime();
        String safeUrl = Secrets.safeUrl(source.jdbcUrl());
        long sourceId = sources.ensure(source.name(), "database", safeUrl);
        String name = reader.sourceName(sourceId);
        long harvestId = journal.start(sourceId);
        Pass pass = new Pass(harvestId, safeUrl);
        String password = source.passwordEnv() == null ? null : environment.apply(source.passwordEnv());
        Dialect dialect = Dialect.forUrl(source.jdbcUrl());
        MetadataReader.Snapshot snapshot;
        try {
            if (source.passwordEnv() != null && password == null) {
                throw new SQLException("the environment variable " + source.passwordEnv()
                        + " that should hold the password is not set");
            }
            try (Connection connection = connect(source, password, dialect)) {
                snapshot = new MetadataReader(dialect, new TableGlobs(source.include(), source.exclude())).read(connection);
            }
        } catch (SQLException | RuntimeException e) {
            pass.error(safeUrl, kindOf(e), "cannot harvest " + safeUrl + ": "
                    + Secrets.scrub(describe(e), password, source.jdbcUrl()));
            return pass.finish(name, HarvestJournal.FAILED, progress, started);
        }
        pass.excluded = snapshot.excluded();
        snapshot.unreadableSchemas().forEach((schema, message) -> pass.error(safeUrl + " schema " + schema,
                "schema_unreadable", message));
        List<Observation> batch = observations(name, sourceId, dialect, snapshot, pass, progress);
        try {
            batch.addAll(owners(source, sourceId, batch, pass));
            pass.changes = ingestor.apply("harvest:" + harvestId, batch).size();
        } catch (RuntimeException e) {
            pass.error(safeUrl, "apply_failed", "the catalog could not take the harvest: " + e.getMessage());
            return pass.finish(name, HarvestJournal.FAILED, progress, started);
        }
        return pass.finish(name, pass.errors == 0 ? HarvestJournal.OK : HarvestJournal.WITH_ERRORS, progress, started);
    }

    /**
     * The owners file's rules for the source's present tables and views, matched against
     * {@code schema/table} in lower case (unquoted SQL names ignore case), so a schema reads as a folder.
     * A missing or unreadable file is an error on the harvest, not its failure.
     */
    private List<Observation> owners(DatabaseSource source, long sourceId, List<Observation> batch, Pass pass) {
        if (source.ownersFile() == null) {
            return List.of();
        }
        String fileUri = source.ownersFile().toUri().toString();
        org.headwater.owners.OwnersFile file;
        try {
            if (!java.nio.file.Files.isRegularFile(source.ownersFile())) {
                pass.error(fileUri, "owners_file", "No owners file at " + source.ownersFile());
                return List.of();
            }
            file = org.headwater.owners.OwnersFile.readFile(source.ownersFile());
        } catch (java.io.IOException e) {
            pass.error(fileUri, "owners_file", "Cannot read the owners file: " + e.getMessage());
            return List.of();
        }
        file.problems().forEach(p -> pass.error(fileUri, "owners_file", p.toString()));
        // The tables of this harvest are the present ones once the batch is applied, in the same transaction.
        Map<String, String> tables = new java.util.HashMap<>();
        for (Observation o : batch) {
            if (o instanceof DatasetSeen seen) {
                tables.put(seen.uri(), seen.name().toLowerCase(java.util.Locale.ROOT).replaceFirst("\\.", "/"));
            }
        }
        return org.headwater.owners.FileOwners.observe(file, tables, reader.owners().currentOfSource(sourceId));
    }

    private static Connection connect(DatabaseSource source, String password, Dialect dialect) throws SQLException {
        Properties properties = new Properties();
        properties.putAll(dialect.connectSettings());
        if (source.user() != null) {
            properties.setProperty("user", source.user());
        }
        if (password != null) {
            properties.setProperty("password", password);
        }
        Connection connection = DriverManager.getConnection(source.jdbcUrl(), properties);
        try {
            connection.setReadOnly(true);
            try (Statement s = connection.createStatement()) {
                for (String sql : dialect.setup()) {
                    s.execute(sql);
                }
            }
            return connection;
        } catch (SQLException | RuntimeException e) {
            connection.close();
            throw e;
        }
    }

    private List<Observation> observations(String name, long sourceId, Dialect dialect, MetadataReader.Snapshot snapshot,
            Pass pass, HarvestProgress progress) {
        Function<Relation, String> uriOf = r -> uri(name, r.schema(), r.name());
        Map<String, CurrentNote> notes = reader.notesOfSource(sourceId);
        ViewLineage views = new ViewLineage(snapshot.relations(), uriOf);
        List<Observation> datasets = new ArrayList<>();
        List<Observation> edges = new ArrayList<>();
        Set<String> seen = new HashSet<>();
        Set<String> keepEdgesOf = new HashSet<>(); // views whose definition could not be analysed this time
        Set<StaticEdge> edgesNow = new HashSet<>();
        for (Relation r : snapshot.relations()) {
            String uri = uriOf.apply(r);
            seen.add(uri);
            datasets.add(new DatasetSeen(uri, r.qualified(), r.kind(), sourceId, dialect.word(), null, null, null,
                    r.rowEstimate(), false, details(name, dialect, snapshot, r), null, columns(r)));
            note(uri, r.comment(), notes.get(uri)).ifPresent(datasets::add);
            pass.relations++;
            progress.filesSeen(pass.relations);
            journal.seen(pass.harvestId, pass.relations);
            if (r.kind() != DatasetKind.VIEW) {
                continue;
            }
            ViewLineage.Result lineage = views.of(r);
            if (lineage.problem() != null) {
                pass.error(uri, "view_lineage", lineage.problem());
            }
            if (lineage.edges().isEmpty() && lineage.problem() != null) {
                keepEdgesOf.add(uri);
            }
            for (EdgeSeen e : lineage.edges()) {
                edges.add(e);
                edgesNow.add(new StaticEdge(e.sourceUri(), e.targetUri(), null));
            }
        }
        List<Observation> batch = new ArrayList<>(datasets);
        batch.addAll(edges);
        String prefix = "db:" + name + "/";
        for (String before : reader.namesOfSource(sourceId).values()) {
            if (before.startsWith(prefix) && !seen.contains(before) && !inUnreadSchema(before, prefix, snapshot)) {
                batch.add(new DatasetGone(before));
                pass.removed++;
            }
        }
        for (StaticEdge before : reader.scriptlessEdgesInto(sourceId)) {
            if (before.targetUri().startsWith(prefix) && !edgesNow.contains(before)
                    && !keepEdgesOf.contains(before.targetUri()) && !inUnreadSchema(before.targetUri(), prefix, snapshot)) {
                batch.add(new EdgeGone(before.sourceUri(), before.targetUri(), null, Evidence.STATIC));
            }
        }
        return batch;
    }

    /** True for a dataset of a schema that could not be read now: it is not gone, only out of sight. */
    private static boolean inUnreadSchema(String uri, String prefix, MetadataReader.Snapshot snapshot) {
        String rest = uri.substring(prefix.length());
        return snapshot.unreadableSchemas().keySet().stream().anyMatch(s -> rest.startsWith(s + "."));
    }

    private static List<ColumnDef> columns(Relation r) {
        return r.columns().stream().map(c -> new ColumnDef(c.name(), c.type(), c.nullable())).toList();
    }

    /** The table comment as the dataset's description, unless a person has written one. */
    private static Optional<Observation> note(String uri, String comment, CurrentNote current) {
        boolean ours = current == null || COMMENT_AUTHOR.equals(current.author());
        if (!ours || (current == null && comment == null)
                || (current != null && Objects.equals(current.description(), comment))) {
            return Optional.empty();
        }
        return Optional.of(new NoteSet(uri, comment, current == null ? Set.of() : Set.copyOf(current.tags()),
                COMMENT_AUTHOR));
    }

    private static String details(String source, Dialect dialect, MetadataReader.Snapshot snapshot, Relation r) {
        Map<String, Object> d = new LinkedHashMap<>();
        d.put("database", snapshot.product());
        d.put("schema", r.schema());
        d.put("table_type", r.tableType());
        if (r.comment() != null) {
            d.put("comment", r.comment());
        }
        Map<String, String> columnComments = new TreeMap<>();
        r.columns().stream().filter(c -> c.comment() != null).forEach(c -> columnComments.put(c.name(), c.comment()));
        if (!columnComments.isEmpty()) {
            d.put("column_comments", columnComments);
        }
        if (!r.primaryKey().isEmpty()) {
            d.put("primary_key", r.primaryKey());
        }
        if (!r.foreignKeys().isEmpty()) {
            List<Map<String, Object>> keys = new ArrayList<>();
            for (Relation.ForeignKey fk : r.foreignKeys()) {
                Map<String, Object> k = new LinkedHashMap<>();
                k.put("name", fk.name());
                k.put("columns", fk.columns());
                k.put("references", uri(source, fk.refSchema(), fk.refTable()));
                k.put("referenced_columns", fk.refColumns());
                keys.add(k);
            }
            d.put("foreign_keys", keys);
        }
        if (r.rowEstimate() != null) {
            d.put("row_count_source", dialect.rowEstimateSource());
        }
        if (r.viewDefinition() != null) {
            d.put("view_definition", r.viewDefinition().strip());
        }
        return Json.canonical(d);
    }

    private static String kindOf(Exception e) {
        String state = e instanceof SQLException s ? s.getSQLState() : null;
        if (state == null) {
            return "database_failed";
        }
        // SQLSTATE classes (ISO/IEC 9075): 08 connection exception, 28 invalid authorization, 42 access rule.
        return switch (state.length() >= 2 ? state.substring(0, 2) : state) {
            case "08" -> "unreachable";
            case "28" -> "login_refused";
            case "42" -> "permission_denied";
            default -> "database_failed";
        };
    }

    private static String describe(Throwable e) {
        StringBuilder text = new StringBuilder(String.valueOf(e.getMessage()));
        Throwable cause = e.getCause();
        if (cause != null && cause.getMessage() != null && !text.toString().contains(cause.getMessage())) {
            text.append(" (").append(cause.getMessage()).append(')');
        }
        return text.toString();
    }

    /** The running counts of one harvest. */
    private final class Pass {
        final long harvestId;
        final String root;
        int relations;
        int changes;
        int removed;
        int errors;
        int excluded;
        final Map<String, Integer> errorsByKind = new TreeMap<>();
        final List<HarvestErrorView> firstErrors = new ArrayList<>();

        Pass(long harvestId, String root) {
            this.harvestId = harvestId;
            this.root = root;
        }

        void error(String uri, String kind, String message) {
            journal.error(harvestId, uri, kind, message);
            errors++;
            errorsByKind.merge(kind, 1, Integer::sum);
            if (firstErrors.size() < ERRORS_IN_SUMMARY) {
                firstErrors.add(new HarvestErrorView(uri, kind, message));
            }
        }

        HarvestSummary finish(String source, String status, HarvestProgress progress, long started) {
            journal.finish(harvestId, status, new HarvestJournal.Counts(relations, 0, excluded, relations, 0, changes, removed,
                    errors));
            progress.finished();
            return new HarvestSummary(harvestId, source, root, status, relations, 0, excluded, relations, 0, changes, removed,
                    errors, Map.copyOf(errorsByKind), List.copyOf(firstErrors), (System.nanoTime() - started) / 1_000_000);
        }
    }
}
