/**
 * The sources configuration: a YAML file listing the folders, object-store prefixes and databases to
 * harvest, with their filters, sampling and schedules; and the runner that harvests them one by one, so
 * one source's failure is that source's record and never stops the others.
 */
package org.headwater.harvest.config;
