/**
 * Freshness checks: the policies datasets are held to (maximum age or an expected cron-like schedule, from
 * the workspace's policy file or the API), the derived make-style check that needs no policy (an output
 * older than one of its inputs), the states with their wording, check history, the scheduled runner of
 * {@code serve} and its webhook.
 */
package org.headwater.checks;
