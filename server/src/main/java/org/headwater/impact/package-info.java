/**
 * Impact reports: what a proposed change to a dataset or column affects downstream (datasets, columns,
 * scripts, figures, views), how far away, through which path, and whom to tell. Built on the lineage
 * graph; {@link org.headwater.impact.ImpactAnalysis} holds the rules for each {@link
 * org.headwater.impact.ChangeKind}, {@link org.headwater.impact.ImpactMarkdown} the text for reviews.
 */
package org.headwater.impact;
