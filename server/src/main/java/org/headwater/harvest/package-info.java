/**
 * Harvesters walk where data lives (local folders now) and describe every file they find as
 * observations for the ingestion path. They never write to the store themselves.
 */
package org.headwater.harvest;
