package org.headwater.checks;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.util.Locale;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Delivers JSON to one URL by HTTP POST, retrying with exponential backoff a bounded number of times.
 * It never throws: a failed delivery is logged and reported. The URL may carry a token, so logs name only
 * its scheme, host and port.
 */
public final class Webhook {
    private static final Logger LOG = LoggerFactory.getLogger(Webhook.class);

    private final Settings settings;
    private final HttpClient client;

    /**
     * How to deliver.
     *
     * @param attempts at most this many requests per payload (at least 1)
     * @param firstDelay the wait before the second attempt; each further wait doubles
     * @param timeout how long one attempt may take
     */
    public record Settings(URI url, int attempts, Duration firstDelay, Duration timeout) {
        public Settings {
            String scheme = url.getScheme() == null ? "" : url.getScheme().toLowerCase(Locale.ROOT);
            if (!(scheme.equals("http") || scheme.equals("https")) || url.getHost() == null) {
                throw new IllegalArgumentException("a webhook URL is http:// or https:// with a host, got '"
                        + redact(url) + "'");
            }
            if (attempts < 1) {
                throw new IllegalArgumentException("attempts must be at least 1");
            }
        }

        /** Five attempts, 2 s before the second and doubling (2, 4, 8, 16 s), 10 s per attempt. */
        public static Settings defaults(URI url) {
            return new Settings(url, 5, Duration.ofSeconds(2), Duration.ofSeconds(10));
        }
    }

    /** How a delivery ended. */
    public record Delivery(boolean delivered, int attempts, String problem) {
    }

    public Webhook(Settings settings) {
        this.settings = settings;
        this.client = HttpClient.newBuilder().connectTimeout(settings.timeout())
                .followRedirects(HttpClient.Redirect.NEVER).build();
    }

    /** Posts {@code json}, retrying what may pass later (no answer, 408, 429, 5xx); gives up at once on other 4xx. */
    public Delivery send(String json) {
        HttpRequest request = HttpRequest.newBuilder(settings.url()).timeout(settings.timeout())
                .header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(json))
                .build();
        String problem = null;
        Duration wait = settings.firstDelay();
        for (int attempt = 1; attempt <= settings.attempts(); attempt++) {
            if (attempt > 1) {
                try {
                    Thread.sleep(wait.toMillis());
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    return failed(attempt - 1, "interrupted after: " + problem);
                }
                wait = wait.multipliedBy(2);
            }
            try {
                int status = client.send(request, HttpResponse.BodyHandlers.discarding()).statusCode();
                if (status >= 200 && status < 300) {
                    return new Delivery(true, attempt, null);
                }
                problem = "answered " + status;
                if (!(status == 408 || status == 429 || status >= 500)) {
                    return failed(attempt, problem + ", which a retry would not change");
                }
            } catch (IOException e) {
                problem = e.getClass().getSimpleName() + (e.getMessage() == null ? "" : ": " + e.getMessage());
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return failed(attempt, "interrupted");
            }
            LOG.debug("Webhook {} attempt {} failed: {}", redact(settings.url()), attempt, problem);
        }
        return failed(settings.attempts(), problem);
    }

    private Delivery failed(int attempts, String problem) {
        LOG.warn("Webhook {} not delivered after {} attempt(s): {}", redact(settings.url()), attempts, problem);
        return new Delivery(false, attempts, problem);
    }

    /** Scheme, host and port only: paths and queries of webhook URLs often hold tokens. */
    static String redact(URI url) {
        return (url.getScheme() == null ? "" : url.getScheme() + "://") + (url.getHost() == null ? "?" : url.getHost())
                + (url.getPort() < 0 ? "" : ":" + url.getPort()) + (url.getRawPath() == null || url.getRawPath().isEmpty()
                ? "" : "/…");
    }
}
