/**
 * S3-compatible object storage as a storage backend: listing with ETags, ranged reads of an object's head
 * and tail, and errors that name what went wrong (unreachable, refused credentials, access denied, no
 * such bucket). Uses the AWS SDK for Java v2.
 */
package org.headwater.harvest.objectstore;
