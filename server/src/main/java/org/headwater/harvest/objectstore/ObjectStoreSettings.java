package org.headwater.harvest.objectstore;

import java.net.URI;
import java.time.Duration;
import java.util.Objects;

/**
 * How to reach one bucket prefix. Secrets are never held here: only the names of the environment
 * variables that hold them, or nothing, which means the SDK's default credential provider chain.
 *
 * @param prefix the key prefix, empty for the whole bucket, else ending in {@code /}
 * @param endpoint the store's endpoint, or null for AWS itself
 * @param pathStyle address the bucket in the path ({@code http://host/bucket/key}) rather than the host name
 * @param accessKeyEnv the environment variable holding the access key id, or null for the default chain
 * @param secretKeyEnv the environment variable holding the secret access key; set exactly when
 *     {@code accessKeyEnv} is
 * @param sessionTokenEnv the environment variable holding a session token, or null
 * @param sampleBytes how many bytes of each object's head are fetched for format detection
 * @param maxAttempts attempts per request, the first included, on throttling, 5xx and connection errors
 */
public record ObjectStoreSettings(String bucket, String prefix, URI endpoint, String region, boolean pathStyle,
        String accessKeyEnv, String secretKeyEnv, String sessionTokenEnv, int sampleBytes, int maxAttempts,
        Duration connectTimeout) {

    public static final int DEFAULT_SAMPLE_KIB = 64;
    public static final int DEFAULT_MAX_ATTEMPTS = 4;
    public static final String DEFAULT_REGION = "us-east-1";

    public ObjectStoreSettings {
        Objects.requireNonNull(bucket, "bucket");
        prefix = prefix == null ? "" : prefix;
        if (!prefix.isEmpty() && !prefix.endsWith("/")) {
            prefix = prefix + "/";
        }
        region = region == null ? DEFAULT_REGION : region;
        if ((accessKeyEnv == null) != (secretKeyEnv == null)) {
            throw new IllegalArgumentException("Name both the access key and the secret key variables, or neither");
        }
        if (sampleBytes <= 0) {
            throw new IllegalArgumentException("The sample size must be positive: " + sampleBytes);
        }
        if (maxAttempts < 1) {
            throw new IllegalArgumentException("maxAttempts must be at least 1: " + maxAttempts);
        }
        connectTimeout = connectTimeout == null ? Duration.ofSeconds(5) : connectTimeout;
    }

    /**
     * Settings for an {@code s3://bucket/prefix} URL with defaults for everything else.
     *
     * @throws IllegalArgumentException when the URL is not of that form
     */
    public static ObjectStoreSettings ofUrl(String url) {
        if (url == null || !url.startsWith("s3://") || url.length() <= "s3://".length()) {
            throw new IllegalArgumentException("Not an s3://bucket/prefix URL: " + url);
        }
        String rest = url.substring("s3://".length());
        int slash = rest.indexOf('/');
        String bucket = slash < 0 ? rest : rest.substring(0, slash);
        String prefix = slash < 0 ? "" : rest.substring(slash + 1);
        if (bucket.isEmpty()) {
            throw new IllegalArgumentException("The URL names no bucket: " + url);
        }
        return new ObjectStoreSettings(bucket, prefix, null, DEFAULT_REGION, false, null, null, null,
                DEFAULT_SAMPLE_KIB * 1024, DEFAULT_MAX_ATTEMPTS, null);
    }

    /** The root as a URL: {@code s3://bucket/prefix}, or on another endpoint as {@link #objectUri} says. */
    public String url() {
        return objectUri(prefix);
    }

    /**
     * The URI of an object (or of the root, for the prefix). On AWS itself: {@code s3://bucket/key}. On another
     * endpoint the bucket name alone does not say which store holds it, so the URI is the object's path-style
     * address on that endpoint ({@code http://host:port/bucket/key}, S3 API "path-style requests"): two stores
     * with a bucket of the same name then never share a dataset.
     */
    public String objectUri(String key) {
        if (endpoint == null) {
            return "s3://" + bucket + "/" + key;
        }
        String base = endpoint.getPath() == null ? "" : endpoint.getPath().replaceAll("/+$", "");
        try {
            return new URI(endpoint.getScheme(), endpoint.getRawAuthority(), base + "/" + bucket + "/" + key, null, null)
                    .toASCIIString();
        } catch (java.net.URISyntaxException e) {
            throw new IllegalArgumentException("The endpoint and key make no URI: " + endpoint + ", " + key, e);
        }
    }

    public ObjectStoreSettings withEndpoint(URI value, boolean pathStyleValue) {
        return new ObjectStoreSettings(bucket, prefix, value, region, pathStyleValue, accessKeyEnv, secretKeyEnv,
                sessionTokenEnv, sampleBytes, maxAttempts, connectTimeout);
    }

    public ObjectStoreSettings withRegion(String value) {
        return new ObjectStoreSettings(bucket, prefix, endpoint, value, pathStyle, accessKeyEnv, secretKeyEnv,
                sessionTokenEnv, sampleBytes, maxAttempts, connectTimeout);
    }

    public ObjectStoreSettings withKeysFrom(String accessEnv, String secretEnv, String tokenEnv) {
        return new ObjectStoreSettings(bucket, prefix, endpoint, region, pathStyle, accessEnv, secretEnv, tokenEnv,
                sampleBytes, maxAttempts, connectTimeout);
    }

    public ObjectStoreSettings withSampleBytes(int value) {
        return new ObjectStoreSettings(bucket, prefix, endpoint, region, pathStyle, accessKeyEnv, secretKeyEnv,
                sessionTokenEnv, value, maxAttempts, connectTimeout);
    }

    public ObjectStoreSettings withRetries(int attempts, Duration connect) {
        return new ObjectStoreSettings(bucket, prefix, endpoint, region, pathStyle, accessKeyEnv, secretKeyEnv,
                sessionTokenEnv, sampleBytes, attempts, connect);
    }
}
