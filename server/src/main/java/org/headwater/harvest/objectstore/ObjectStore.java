package org.headwater.harvest.objectstore;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.headwater.harvest.StorageBackend;
import org.headwater.harvest.StoreUnavailableException;
import org.headwater.harvest.StoredObject;
import org.headwater.harvest.format.TailReader;
import software.amazon.awssdk.auth.credentials.AwsBasicCredentials;
import software.amazon.awssdk.auth.credentials.AwsCredentialsProvider;
import software.amazon.awssdk.auth.credentials.AwsSessionCredentials;
import software.amazon.awssdk.auth.credentials.DefaultCredentialsProvider;
import software.amazon.awssdk.auth.credentials.StaticCredentialsProvider;
import software.amazon.awssdk.awscore.retry.AwsRetryStrategy;
import software.amazon.awssdk.core.ResponseBytes;
import software.amazon.awssdk.core.checksums.RequestChecksumCalculation;
import software.amazon.awssdk.core.checksums.ResponseChecksumValidation;
import software.amazon.awssdk.http.apache.ApacheHttpClient;
import software.amazon.awssdk.regions.Region;
import software.amazon.awssdk.services.s3.S3Client;
import software.amazon.awssdk.services.s3.model.GetObjectRequest;
import software.amazon.awssdk.services.s3.model.GetObjectResponse;
import software.amazon.awssdk.services.s3.model.ListObjectsV2Request;
import software.amazon.awssdk.services.s3.model.S3Object;

/**
 * An S3-compatible bucket prefix as a storage backend. Lists with the paginated ListObjectsV2, fetches only
 * the first bytes of each object (a ranged GET) and, for formats that need it, the last bytes (a suffix
 * range); both reads carry the listed ETag in {@code If-Match}, so an object rewritten since the listing
 * fails that one object instead of mixing two versions. Requests are retried with the SDK's standard
 * strategy (exponential backoff with jitter on throttling, 5xx and connection errors).
 */
public final class ObjectStore implements StorageBackend, AutoCloseable {
    private final ObjectStoreSettings settings;
    private final S3Client client;

    private ObjectStore(ObjectStoreSettings settings, S3Client client) {
        this.settings = settings;
        this.client = client;
    }

    /**
     * Opens a client for the settings.
     *
     * @param env looks up environment variables (System::getenv; tests pass their own)
     * @param connections how many requests may run at once
     * @throws IllegalArgumentException naming the variable when a configured key variable is not set
     */
    public static ObjectStore open(ObjectStoreSettings settings, Function<String, String> env, int connections) {
        var builder = S3Client.builder()
                .region(Region.of(settings.region()))
                .forcePathStyle(settings.pathStyle())
                .credentialsProvider(credentials(settings, env))
                // Many S3-compatible stores do not implement the newer default request checksums.
                .requestChecksumCalculation(RequestChecksumCalculation.WHEN_REQUIRED)
                .responseChecksumValidation(ResponseChecksumValidation.WHEN_REQUIRED)
                .httpClientBuilder(ApacheHttpClient.builder()
                        .connectionTimeout(settings.connectTimeout())
                        .socketTimeout(Duration.ofSeconds(60))
                        .maxConnections(Math.max(4, connections * 2)))
                .overrideConfiguration(o -> o.retryStrategy(AwsRetryStrategy.standardRetryStrategy().toBuilder()
                        .maxAttempts(settings.maxAttempts()).build()));
        if (settings.endpoint() != null) {
            builder.endpointOverride(settings.endpoint());
        }
        return new ObjectStore(settings, builder.build());
    }

    private static AwsCredentialsProvider credentials(ObjectStoreSettings settings, Function<String, String> env) {
        if (settings.accessKeyEnv() == null) {
            return DefaultCredentialsProvider.builder().build();
        }
        String id = required(env, settings.accessKeyEnv());
        String secret = required(env, settings.secretKeyEnv());
        if (settings.sessionTokenEnv() != null) {
            return StaticCredentialsProvider.create(AwsSessionCredentials.create(id, secret,
                    required(env, settings.sessionTokenEnv())));
        }
        return StaticCredentialsProvider.create(AwsBasicCredentials.create(id, secret));
    }

    private static String required(Function<String, String> env, String name) {
        String value = env.apply(name);
        if (value == null || value.isEmpty()) {
            throw new IllegalArgumentException("The environment variable " + name + " is not set");
        }
        return value;
    }

    @Override
    public String kind() {
        return "s3";
    }

    @Override
    public String rootUri() {
        return settings.url();
    }

    @Override
    public String defaultName() {
        String p = settings.prefix();
        if (p.isEmpty()) {
            return settings.bucket();
        }
        String trimmed = p.substring(0, p.length() - 1);
        return trimmed.substring(trimmed.lastIndexOf('/') + 1);
    }

    @Override
    public Listing list() throws IOException {
        List<StoredObject> objects = new ArrayList<>();
        int ignored = 0;
        try {
            var pages = client.listObjectsV2Paginator(ListObjectsV2Request.builder()
                    .bucket(settings.bucket()).prefix(settings.prefix()).build());
            for (S3Object o : pages.contents()) {
                String name = o.key().substring(settings.prefix().length());
                // Folder markers (empty keys ending in /) and hidden names are not data, as in a local folder.
                if (name.isEmpty() || name.endsWith("/") || hidden(name)) {
                    ignored++;
                    continue;
                }
                objects.add(new StoredObject(name, uriOfKey(o.key()), o.size(), o.lastModified(), unquote(o.eTag())));
            }
        } catch (RuntimeException e) {
            throw new IOException(ObjectStoreErrors.describe(e, settings), e);
        }
        objects.sort(java.util.Comparator.comparing(StoredObject::name));
        return new Listing(objects, ignored, List.of());
    }

    private static boolean hidden(String name) {
        for (String segment : name.split("/")) {
            if (segment.startsWith(".")) {
                return true;
            }
        }
        return false;
    }

    @Override
    public String uriOf(String relativeName) {
        return uriOfKey(settings.prefix() + relativeName);
    }

    private String uriOfKey(String key) {
        return settings.objectUri(key);
    }

    @Override
    public InputStream open(StoredObject object, long length) throws IOException {
        long n = Math.min(length, object.size());
        if (n <= 0) {
            return new ByteArrayInputStream(new byte[0]);
        }
        // RFC 9110 section 14.1.2: bytes=first-last, both inclusive.
        return new ByteArrayInputStream(get(object, "bytes=0-" + (n - 1)));
    }

    @Override
    public boolean hashesContent() {
        return false;
    }

    @Override
    public TailReader tailOf(StoredObject object) {
        return n -> {
            if (n == 0) {
                return new byte[0];
            }
            // RFC 9110 section 14.1.2: a suffix range, bytes=-n, asks for the last n bytes.
            byte[] bytes = get(object, "bytes=-" + n);
            int expected = (int) Math.min(n, object.size());
            if (bytes.length != expected) {
                throw new IOException("Asked for the last " + expected + " bytes of " + object.uri() + ", got " + bytes.length);
            }
            return bytes;
        };
    }

    private byte[] get(StoredObject object, String range) throws IOException {
        var request = GetObjectRequest.builder().bucket(settings.bucket()).key(settings.prefix() + object.name())
                .range(range);
        if (object.etag() != null) {
            request.ifMatch('"' + object.etag() + '"');
        }
        try {
            ResponseBytes<GetObjectResponse> bytes = client.getObjectAsBytes(request.build());
            return bytes.asByteArray();
        } catch (RuntimeException e) {
            String message = ObjectStoreErrors.describe(e, settings);
            if (ObjectStoreErrors.storeWide(e)) {
                throw new StoreUnavailableException(message, e);
            }
            throw new IOException(message, e);
        }
    }

    private static String unquote(String etag) {
        if (etag == null) {
            return null;
        }
        String t = etag.trim();
        return t.length() >= 2 && t.startsWith("\"") && t.endsWith("\"") ? t.substring(1, t.length() - 1) : t;
    }

    /** The SDK client, for callers that build their own requests on the same connection pool (benchmarks). */
    S3Client client() {
        return client;
    }

    @Override
    public void close() {
        client.close();
    }
}
