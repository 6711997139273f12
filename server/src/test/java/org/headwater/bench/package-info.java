/**
 * Benchmarks: runnable mains that print figures next to a floor or a naive alternative measured in the
 * same run. They are compiled with the tests but never run as tests; DEVELOPERS.md says how to run them.
 */
package org.headwater.bench;
