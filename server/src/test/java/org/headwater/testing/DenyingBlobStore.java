package org.headwater.testing;

import java.util.Set;
import org.gaul.s3proxy.blobstore.BlobStore;
import org.gaul.s3proxy.blobstore.ForwardingBlobStore;
import software.amazon.awssdk.awscore.exception.AwsErrorDetails;
import software.amazon.awssdk.core.ResponseInputStream;
import software.amazon.awssdk.http.SdkHttpResponse;
import software.amazon.awssdk.services.s3.model.GetObjectRequest;
import software.amazon.awssdk.services.s3.model.GetObjectResponse;
import software.amazon.awssdk.services.s3.model.HeadBucketRequest;
import software.amazon.awssdk.services.s3.model.HeadBucketResponse;
import software.amazon.awssdk.services.s3.model.HeadObjectRequest;
import software.amazon.awssdk.services.s3.model.HeadObjectResponse;
import software.amazon.awssdk.services.s3.model.ListObjectsV2Request;
import software.amazon.awssdk.services.s3.model.ListObjectsV2Response;
import software.amazon.awssdk.services.s3.model.S3Exception;

/**
 * S3Proxy's blob store with reads of some buckets or objects refused. S3Proxy has one identity, so a policy
 * that denies one caller one bucket is played here, inside the server: the refusal leaves S3Proxy as the
 * store's own error document over HTTP ({@code 403}, code {@code AccessDenied}), exactly what a client of a
 * store with a bucket policy receives. The client side is not touched.
 */
final class DenyingBlobStore extends ForwardingBlobStore {
    private final Set<String> denied;

    DenyingBlobStore(BlobStore delegate, Set<String> denied) {
        super(delegate);
        this.denied = denied;
    }

    @Override
    public ListObjectsV2Response list(ListObjectsV2Request request) {
        check(request.bucket(), null);
        return super.list(request);
    }

    @Override
    public HeadBucketResponse headBucket(HeadBucketRequest request) {
        check(request.bucket(), null);
        return super.headBucket(request);
    }

    @Override
    public ResponseInputStream<GetObjectResponse> getBlob(GetObjectRequest request) {
        check(request.bucket(), request.key());
        return super.getBlob(request);
    }

    @Override
    public HeadObjectResponse blobMetadata(HeadObjectRequest request) {
        check(request.bucket(), request.key());
        return super.blobMetadata(request);
    }

    private void check(String bucket, String key) {
        if (denied.contains(bucket) || (key != null && denied.contains(bucket + "/" + key))) {
            // expected: Amazon S3 API Reference, "Error responses": AccessDenied, HTTP 403 Forbidden.
            throw (S3Exception) S3Exception.builder()
                    .statusCode(403)
                    .message("Access Denied")
                    .awsErrorDetails(AwsErrorDetails.builder().errorCode("AccessDenied").errorMessage("Access Denied")
                            .sdkHttpResponse(SdkHttpResponse.builder().statusCode(403).build()).build())
                    .build();
        }
    }
}
