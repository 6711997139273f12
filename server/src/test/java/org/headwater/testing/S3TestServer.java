package org.headwater.testing;

import java.net.URI;
import java.time.Duration;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.gaul.s3proxy.S3Proxy;
import org.gaul.s3proxy.auth.AuthenticationType;
import org.gaul.s3proxy.nio2blob.TransientNio2BlobStore;
import software.amazon.awssdk.auth.credentials.AwsBasicCredentials;
import software.amazon.awssdk.auth.credentials.StaticCredentialsProvider;
import software.amazon.awssdk.core.checksums.RequestChecksumCalculation;
import software.amazon.awssdk.core.checksums.ResponseChecksumValidation;
import software.amazon.awssdk.core.sync.RequestBody;
import software.amazon.awssdk.http.apache.ApacheHttpClient;
import software.amazon.awssdk.regions.Region;
import software.amazon.awssdk.services.s3.S3Client;
import software.amazon.awssdk.services.s3.model.PutObjectRequest;

/**
 * A real S3-compatible server (S3Proxy over an in-memory blob store) on a free loopback port, for tests and
 * benchmarks that fill buckets and harvest them. Nothing is mocked: requests go over HTTP and are signed.
 */
public final class S3TestServer implements AutoCloseable {
    /** Test credentials: invented, and only ever valid for this in-process server. */
    public static final String ACCESS_KEY = "tide-gauge-reader";
    public static final String SECRET_KEY = "pebble-lantern-7Q2x-secret-never-stored";

    private final S3Proxy proxy;
    private final S3Client client;
    private final Set<String> denied;

    private S3TestServer(S3Proxy proxy, S3Client client, Set<String> denied) {
        this.proxy = proxy;
        this.client = client;
        this.denied = denied;
    }

    public static S3TestServer start() throws Exception {
        Set<String> denied = ConcurrentHashMap.newKeySet();
        S3Proxy proxy = S3Proxy.builder()
                .blobStore(new DenyingBlobStore(new TransientNio2BlobStore(), denied))
                .endpoint(URI.create("http://127.0.0.1:0"))
                .awsAuthentication(AuthenticationType.AWS_V2_OR_V4, ACCESS_KEY, SECRET_KEY)
                .build();
        proxy.start();
        long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
        while (!"STARTED".equals(proxy.getState())) {
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("S3Proxy did not start: " + proxy.getState());
            }
            Thread.sleep(10);
        }
        URI endpoint = URI.create("http://127.0.0.1:" + proxy.getPort());
        S3Client client = S3Client.builder()
                .endpointOverride(endpoint)
                .forcePathStyle(true)
                .region(Region.US_EAST_1)
                .requestChecksumCalculation(RequestChecksumCalculation.WHEN_REQUIRED)
                .responseChecksumValidation(ResponseChecksumValidation.WHEN_REQUIRED)
                .httpClientBuilder(ApacheHttpClient.builder().maxConnections(16))
                .credentialsProvider(StaticCredentialsProvider.create(AwsBasicCredentials.create(ACCESS_KEY, SECRET_KEY)))
                .build();
        return new S3TestServer(proxy, client, denied);
    }

    /**
     * From now on the server answers {@code 403 AccessDenied} to every read of the bucket ({@code "bucket"}) or
     * of one object ({@code "bucket/key"}), as a store does when a bucket policy denies the caller; writes
     * through {@link #client()} still work.
     */
    public void deny(String bucketOrObject) {
        denied.add(bucketOrObject);
    }

    /** Lifts a {@link #deny}. */
    public void allow(String bucketOrObject) {
        denied.remove(bucketOrObject);
    }

    public URI endpoint() {
        return URI.create("http://127.0.0.1:" + proxy.getPort());
    }

    /** A client signed with the server's credentials, for filling buckets. */
    public S3Client client() {
        return client;
    }

    public void createBucket(String bucket) {
        client.createBucket(b -> b.bucket(bucket));
    }

    public void put(String bucket, String key, byte[] bytes) {
        client.putObject(PutObjectRequest.builder().bucket(bucket).key(key).build(), RequestBody.fromBytes(bytes));
    }

    public void delete(String bucket, String key) {
        client.deleteObject(b -> b.bucket(bucket).key(key));
    }

    @Override
    public void close() {
        client.close();
        try {
            proxy.stop();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } catch (Exception e) {
            throw new IllegalStateException("S3Proxy did not stop", e);
        }
    }
}
