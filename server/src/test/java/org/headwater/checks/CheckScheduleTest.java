package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.sun.net.httpserver.HttpServer;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CheckScheduleTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;

    @Test
    void theFirstScheduledRunPostsTheFailingDatasetsToTheWebhookAfterARefusedAttempt() throws Exception {
        Path workspace = HiveWorkspace.write(temp.resolve("hive-coop"));
        HttpServer receiver = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
        AtomicInteger attempts = new AtomicInteger();
        List<String> bodies = new java.util.concurrent.CopyOnWriteArrayList<>();
        CountDownLatch delivered = new CountDownLatch(1);
        receiver.createContext("/", exchange -> {
            bodies.add(new String(exchange.getRequestBody().readAllBytes(), StandardCharsets.UTF_8));
            boolean fail = attempts.incrementAndGet() == 1;
            exchange.sendResponseHeaders(fail ? 502 : 200, -1);
            exchange.close();
            if (!fail) {
                delivered.countDown();
            }
        });
        receiver.start();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"), Clock.fixed(HiveWorkspace.NOW, ZoneOffset.UTC))) {
            catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
            Webhook hook = new Webhook(new Webhook.Settings(URI.create("http://127.0.0.1:"
                    + receiver.getAddress().getPort() + "/"), 4, Duration.ofMillis(20), Duration.ofSeconds(5)));
            try (CheckSchedule schedule = CheckSchedule.start(catalog::freshness, Duration.ofHours(1), hook)) {
                assertThat(delivered.await(60, TimeUnit.SECONDS)).isTrue();
            }
            assertThat(attempts.get()).isEqualTo(2);
            assertThat(bodies.get(1)).isEqualTo(bodies.get(0));
            JsonNode payload = JSON.readTree(bodies.get(1));
            assertThat(payload.get("event").asText()).isEqualTo("freshness-changed");
            assertThat(payload.get("checkedAt").asText()).isEqualTo("2026-12-07T08:30:00Z");
            List<String> changed = new ArrayList<>();
            for (JsonNode change : payload.get("changes")) {
                assertThat(change.get("previousState").isNull()).isTrue();
                changed.add(change.get("check").get("name").asText() + " " + change.get("check").get("state").asText());
            }
            // A first run tells only what fails; the fresh, due and unknown datasets wait for a change.
            assertThat(changed).containsExactly("hives/daily_summary.csv stale", "hives/feed_log.csv late",
                    "reports/monthly.csv late");
            assertThat(payload.get("counts").get("late").asInt()).isEqualTo(2);
            // The run was recorded: a second one finds nothing new to tell.
            assertThat(catalog.freshness().record().transitions()).isEmpty();
        } finally {
            receiver.stop(0);
        }
    }

    @Test
    void aStateChangeFromAKnownStateIsWorthTellingAndAFirstHarmlessStateIsNot() {
        Check fresh = new Check(1, "a.csv", "fresh", HiveWorkspace.NOW, "…", null, null, HiveWorkspace.NOW, null);
        Check unknown = new Check(2, "b.csv", "unknown", HiveWorkspace.NOW, "…", null, null, null, null);
        Check late = new Check(3, "c.csv", "late", HiveWorkspace.NOW, "…", "max-age 1d", null, HiveWorkspace.NOW, null);

        assertThat(CheckSchedule.worthTelling(List.of(new Transition("late", fresh), new Transition(null, unknown),
                new Transition(null, late)))).extracting(t -> t.check().name()).containsExactly("a.csv", "c.csv");
    }
}
