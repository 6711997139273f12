package org.headwater.checks;

import com.fasterxml.jackson.annotation.JsonProperty;
import java.time.Instant;
import java.util.List;

/** A dataset's recorded check states and its policies over time, newest first. */
public record History(@JsonProperty("datasetId") long datasetId, @JsonProperty("name") String name,
        @JsonProperty("checks") List<Entry> checks, @JsonProperty("policies") List<PolicyEntry> policies) {

    /** One recorded state: found at {@code recordedAt}, held until {@code endedAt} (null while current). */
    public record Entry(@JsonProperty("state") String state, @JsonProperty("since") Instant since,
            @JsonProperty("why") String why, @JsonProperty("policy") String policy,
            @JsonProperty("newerInput") Check.NewerInput newerInput, @JsonProperty("recordedAt") Instant recordedAt,
            @JsonProperty("endedAt") Instant endedAt) {
    }

    /** One policy the dataset was held to, who set it, and for how long. */
    public record PolicyEntry(@JsonProperty("policy") String policy, @JsonProperty("setBy") String setBy,
            @JsonProperty("validFrom") Instant validFrom, @JsonProperty("validTo") Instant validTo) {
    }
}
