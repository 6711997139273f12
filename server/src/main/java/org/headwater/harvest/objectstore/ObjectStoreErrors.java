package org.headwater.harvest.objectstore;

import java.net.ConnectException;
import java.net.NoRouteToHostException;
import java.net.SocketTimeoutException;
import java.net.UnknownHostException;
import java.util.Map;
import software.amazon.awssdk.awscore.exception.AwsServiceException;
import software.amazon.awssdk.core.exception.SdkClientException;

/**
 * Turns SDK failures into messages a person can act on. The messages name the endpoint, bucket and the
 * store's error code; they never hold a credential (the SDK's own messages hold none either).
 */
final class ObjectStoreErrors {
    /** S3 error codes (Amazon S3 API Reference, "Error responses": list of error codes) and what they mean here. */
    private static final Map<String, String> CODES = Map.of(
            "NoSuchBucket", "the bucket does not exist",
            "InvalidAccessKeyId", "the store does not know the access key id (wrong credentials)",
            "SignatureDoesNotMatch", "the store rejected the request signature (wrong secret key)",
            "AccessDenied", "access denied: the credentials may not list or read this prefix",
            "InvalidBucketName", "the bucket name is not valid",
            "ExpiredToken", "the session token has expired",
            "PreconditionFailed", "the object changed while it was read");

    private ObjectStoreErrors() {
    }

    static String describe(RuntimeException e, ObjectStoreSettings settings) {
        String where = "s3://" + settings.bucket() + "/" + settings.prefix() + (settings.endpoint() == null ? "" : " at " + settings.endpoint());
        if (e instanceof AwsServiceException s) {
            String code = s.awsErrorDetails() == null ? null : s.awsErrorDetails().errorCode();
            String meaning = code == null ? null : CODES.get(code);
            if (meaning == null && s.statusCode() == 403) {
                meaning = "access denied (HTTP 403)";
            }
            if (meaning == null && s.statusCode() == 404) {
                meaning = "not found (HTTP 404)";
            }
            return where + ": " + (meaning == null ? "the store answered HTTP " + s.statusCode() : meaning)
                    + (code == null ? "" : " [" + code + "]");
        }
        if (e instanceof SdkClientException) {
            Throwable cause = rootCause(e);
            if (cause instanceof ConnectException || cause instanceof UnknownHostException
                    || cause instanceof NoRouteToHostException || cause instanceof SocketTimeoutException) {
                return where + ": cannot reach the store (" + cause.getClass().getSimpleName() + ": "
                        + cause.getMessage() + ")";
            }
            return where + ": " + e.getMessage();
        }
        return where + ": " + e;
    }

    /** Codes that say the credentials, not one object, are at fault. */
    private static final java.util.Set<String> CREDENTIAL_CODES = java.util.Set.of("InvalidAccessKeyId",
            "SignatureDoesNotMatch", "ExpiredToken");

    /**
     * Whether a failed object read is the store's failure rather than the object's: no connection, refused
     * credentials, or a 5xx or throttling answer left after the retries.
     */
    static boolean storeWide(RuntimeException e) {
        if (e instanceof AwsServiceException s) {
            String code = s.awsErrorDetails() == null ? null : s.awsErrorDetails().errorCode();
            return s.statusCode() >= 500 || s.isThrottlingException() || CREDENTIAL_CODES.contains(code);
        }
        return e instanceof SdkClientException;
    }

    private static Throwable rootCause(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        return t;
    }
}
