package org.headwater.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import io.javalin.http.HttpStatus;
import java.util.List;
import java.util.concurrent.atomic.AtomicReference;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourceSchedule;
import org.headwater.harvest.config.SourceSpec;

/**
 * {@code /api/sources}: the sources file {@code serve --config} was given, and harvests of one of them on
 * request. Only named sources can be harvested this way, never a path the caller chooses.
 */
final class SourceRoutes {
    private final AtomicReference<SourceSchedule> schedule;

    SourceRoutes(AtomicReference<SourceSchedule> schedule) {
        this.schedule = schedule;
    }

    /** One configured source as the API shows it: no credentials, no variable names. */
    record SourceView(String name, String kind, String root, Long everySeconds, boolean harvestRequested) {
    }

    /** The answer to a harvest request. */
    record Requested(String source, String state, String harvests) {
    }

    void list(Context ctx) {
        SourceSchedule s = schedule.get();
        List<SourceView> views = s == null ? List.of() : s.sources().stream().map(spec -> view(s, spec)).toList();
        ctx.json(views);
    }

    void harvest(Context ctx) {
        SourceSchedule s = schedule.get();
        if (s == null) {
            throw ApiError.of(404, "no_sources", "This server was started without a sources file (serve --config FILE)");
        }
        String name = ctx.pathParam("name");
        boolean full = fullOption(ctx);
        String harvests = "/api/harvests";
        switch (s.request(name, full)) {
            case NO_SUCH_SOURCE -> throw ApiError.notFound("No source named '" + name + "' in the sources file");
            case ALREADY_QUEUED -> ctx.status(HttpStatus.ACCEPTED).json(new Requested(name, "already_requested", harvests));
            case QUEUED -> ctx.status(HttpStatus.ACCEPTED).json(new Requested(name, "requested", harvests));
        }
    }

    private static boolean fullOption(Context ctx) {
        String body = ctx.body();
        if (body.isBlank()) {
            return false;
        }
        JsonNode node;
        try {
            node = ApiJson.mapper().readTree(body);
        } catch (java.io.IOException e) {
            throw ApiError.badRequest("The request body is not valid JSON");
        }
        JsonNode full = node == null ? null : node.get("full");
        if (node == null || !node.isObject() || (full != null && !full.isBoolean())) {
            throw ApiError.badRequest("The body is optional; when given it is {\"full\": true|false}");
        }
        return full != null && full.asBoolean();
    }

    private static SourceView view(SourceSchedule s, SourceSpec spec) {
        return new SourceView(spec.name(), spec.kind(), SourceRunner.rootUri(spec),
                spec.every().map(java.time.Duration::toSeconds).orElse(null), s.requested(spec.name()));
    }
}
