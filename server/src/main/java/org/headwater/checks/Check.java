package org.headwater.checks;

import com.fasterxml.jackson.annotation.JsonProperty;
import java.time.Instant;

/**
 * One dataset's freshness, as the API, {@code headwater check --json} and the webhook report it. The field
 * names are a contract with the web UI and written out explicitly, so the API's snake_case rule does not
 * rename them.
 *
 * @param policy the canonical text of the policy it is held to, or null
 * @param policyFrom who set the policy (the policy file and line, or {@code api:} and a name), or null
 * @param newerInput the input newer than the dataset, when there is one
 */
public record Check(@JsonProperty("datasetId") long datasetId, @JsonProperty("name") String name,
        @JsonProperty("state") String state, @JsonProperty("since") Instant since, @JsonProperty("why") String why,
        @JsonProperty("policy") String policy, @JsonProperty("policyFrom") String policyFrom,
        @JsonProperty("modifiedAt") Instant modifiedAt, @JsonProperty("newerInput") NewerInput newerInput) {

    /** The input that makes a dataset stale. */
    public record NewerInput(@JsonProperty("datasetId") long datasetId, @JsonProperty("name") String name,
            @JsonProperty("modifiedAt") Instant modifiedAt) {
    }

    public FreshnessState freshnessState() {
        return FreshnessState.of(state);
    }
}
