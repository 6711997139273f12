package org.headwater.lineage;

/**
 * One hop of a path as answers show it, in the direction data flows: from which dataset (and column) to
 * which, through which script or run, on what evidence. Columns and role are null on dataset paths.
 */
public record Step(long edgeId, String from, String fromColumn, String to, String toColumn, String role,
        String script, String run, String evidence, double confidence) {
}
