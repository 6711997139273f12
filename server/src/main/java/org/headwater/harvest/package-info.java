/**
 * Harvesters walk where data lives (local folders, S3-compatible object stores, through one pipeline over
 * a {@link org.headwater.harvest.StorageBackend}) and describe every file they find as
 * observations for the ingestion path. They never write to the store themselves.
 */
package org.headwater.harvest;
