package org.headwater.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import static org.headwater.store.schema.Tables.RUN;

import java.io.IOException;
import java.net.URI;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;
import org.headwater.access.Roots;
import org.headwater.access.Tokens;
import org.headwater.ingest.Change;
import org.headwater.ingest.Observation.RunIo;
import org.headwater.ingest.Observation.RunReported;
import org.headwater.model.ColumnDef;

/** {@code POST /api/runs}: run records from the runtime connectors, into the ingestion path. */
final class RunRoutes {
    private static final Pattern RUN_ID = Pattern.compile("[A-Za-z0-9._:-]{1,64}");
    private static final Set<String> DIRECTIONS = Set.of("read", "write", "delete", "rename_from", "rename_to");
    private static final int MAX_IO = 100_000;

    private final CatalogHolder catalog;
    private final Roots roots;
    private final Access access;

    RunRoutes(CatalogHolder catalog, Roots roots, Access access) {
        this.catalog = catalog;
        this.roots = roots;
        this.access = access;
    }

    /** The answer to a posted run: whether it was new, and the inputs and outputs refused by path. */
    record Stored(String runId, boolean created, List<Refused> refused) {
    }

    /** An input or output left out of a run because its path may not enter the catalog. */
    record Refused(String path, String direction, String reason) {
    }

    void post(Context ctx) {
        RunReported parsed = parse(ctx.body());
        Path script = Path.of(URI.create(parsed.scriptUri()));
        roots.refusal(script).ifPresent(reason -> {
            throw ApiError.forbidden("path_outside_roots", "The script " + script + " is " + reason);
        });
        List<RunIo> kept = new ArrayList<>();
        List<Refused> refused = new ArrayList<>();
        for (RunIo io : parsed.io()) {
            Path path = Path.of(URI.create(io.uri()));
            roots.refusal(path).ifPresentOrElse(
                    reason -> refused.add(new Refused(path.toString(), io.direction(), reason)),
                    () -> kept.add(io));
        }
        RunReported run = new RunReported(parsed.runId(), parsed.client(), parsed.scriptUri(), parsed.scriptHash(),
                parsed.gitCommit(), parsed.startedAt(), parsed.endedAt(), parsed.exitCode(), parsed.exception(),
                parsed.user(), parsed.host(), parsed.arguments(), kept);
        conflict(run);
        List<Change> changes = catalog.get().ingestor().apply("runtime", List.of(run));
        boolean created = !changes.isEmpty();
        for (Refused r : refused) {
            Tokens.Token token = ctx.attribute(Access.TOKEN);
            access.audit().record(token == null ? null : token.id(), token == null ? "anonymous" : token.name(),
                    "run.io_refused", r.path(), 403, ctx.ip(), "run " + run.runId() + ": " + r.reason());
        }
        ctx.status(created ? 201 : 200).json(new Stored(run.runId(), created, refused));
    }

    /** A run id names one run: the same id again with another script or start time is a client bug, not a resend. */
    private void conflict(RunReported run) {
        var stored = catalog.get().store().dsl().select(RUN.SCRIPT_URI, RUN.STARTED_AT).from(RUN)
                .where(RUN.ID.eq(run.runId())).fetchOne();
        if (stored != null && (!run.scriptUri().equals(stored.value1())
                || !run.startedAt().equals(stored.value2().toInstant()))) {
            throw ApiError.conflict("Run '" + run.runId() + "' is already stored for another script or start time;"
                    + " a resent run must be identical, a new run needs a new run_id");
        }
    }

    static RunReported parse(String body) {
        JsonNode root;
        try {
            root = ApiJson.mapper().readTree(body);
        } catch (IOException e) {
            throw ApiError.badRequest("The run record is not valid JSON");
        }
        if (root == null || !root.isObject()) {
            throw ApiError.badRequest("The run record must be a JSON object");
        }
        String runId = text(root, "run_id", true);
        if (!RUN_ID.matcher(runId).matches()) {
            throw ApiError.badRequest("'run_id' must be 1 to 64 letters, digits, '.', '_', ':' or '-'");
        }
        JsonNode script = root.get("script");
        if (script == null || !script.isObject()) {
            throw ApiError.badRequest("'script' must be an object with at least 'path'");
        }
        List<RunIo> io = new ArrayList<>();
        JsonNode ios = root.get("io");
        if (ios != null && !ios.isNull()) {
            if (!ios.isArray() || ios.size() > MAX_IO) {
                throw ApiError.badRequest("'io' must be an array of at most " + MAX_IO + " entries");
            }
            for (JsonNode entry : ios) {
                io.add(io(entry));
            }
        }
        JsonNode args = root.get("args");
        if (args != null && !args.isNull() && !args.isArray()) {
            throw ApiError.badRequest("'args' must be an array of strings");
        }
        JsonNode exit = root.get("exit_code");
        return new RunReported(runId, text(root, "client", false), uri(text(script, "path", true)),
                text(script, "sha256", false), text(script, "git_commit", false),
                time(root, "started_at", true), time(root, "ended_at", false),
                exit == null || exit.isNull() ? null : exit.asInt(), text(root, "exception", false),
                text(root, "user", false), text(root, "host", false),
                args == null || args.isNull() ? "[]" : args.toString(), io);
    }

    private static RunIo io(JsonNode entry) {
        if (!entry.isObject()) {
            throw ApiError.badRequest("Every 'io' entry must be an object with 'path' and 'direction'");
        }
        String direction = text(entry, "direction", true);
        if (!DIRECTIONS.contains(direction)) {
            throw ApiError.badRequest("'direction' must be one of " + DIRECTIONS + ", got '" + direction + "'");
        }
        List<ColumnDef> columns = null;
        Long rows = null;
        JsonNode frame = entry.get("frame");
        if (frame != null && frame.isObject() && frame.get("columns") != null && frame.get("columns").isArray()) {
            columns = new ArrayList<>();
            JsonNode types = frame.get("dtypes");
            for (int i = 0; i < frame.get("columns").size(); i++) {
                String type = types != null && types.isArray() && i < types.size() ? types.get(i).asText() : "unknown";
                columns.add(new ColumnDef(frame.get("columns").get(i).asText(), type, true));
            }
            rows = frame.hasNonNull("rows") ? frame.get("rows").asLong() : null;
        }
        JsonNode bytes = entry.get("bytes");
        return new RunIo(uri(text(entry, "path", true)), direction, bytes == null || bytes.isNull() ? null : bytes.asLong(),
                text(entry, "sha256", false), text(entry, "via", false), columns, rows);
    }

    private static String uri(String path) {
        try {
            Path p = Path.of(path);
            if (!p.isAbsolute()) {
                throw ApiError.badRequest("Paths in a run record must be absolute: '" + path + "'");
            }
            return p.normalize().toUri().toString();
        } catch (InvalidPathException e) {
            throw ApiError.badRequest("Not a path: '" + path + "'");
        }
    }

    private static String text(JsonNode node, String field, boolean required) {
        JsonNode value = node.get(field);
        if (value == null || value.isNull()) {
            if (required) {
                throw ApiError.badRequest("'" + field + "' is required");
            }
            return null;
        }
        if (!value.isValueNode()) {
            throw ApiError.badRequest("'" + field + "' must be a string");
        }
        return value.asText();
    }

    private static Instant time(JsonNode node, String field, boolean required) {
        String raw = text(node, field, required);
        try {
            return raw == null ? null : Instant.parse(raw);
        } catch (DateTimeParseException e) {
            throw ApiError.badRequest("'" + field + "' must be an ISO-8601 time such as 2026-12-01T22:00:00.123Z");
        }
    }
}
