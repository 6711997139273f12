package org.headwater.checks;

import com.fasterxml.jackson.annotation.JsonIgnore;
import com.fasterxml.jackson.annotation.JsonProperty;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Every present dataset's freshness, with the number in each state (every state listed, zero or not). */
public record Report(@JsonProperty("checkedAt") Instant checkedAt, @JsonProperty("checks") List<Check> checks,
        @JsonProperty("counts") Map<String, Integer> counts) {

    static Report of(Instant checkedAt, List<Check> checks) {
        Map<String, Integer> counts = new LinkedHashMap<>();
        for (FreshnessState state : FreshnessState.values()) {
            counts.put(state.word(), 0);
        }
        for (Check check : checks) {
            counts.merge(check.state(), 1, Integer::sum);
        }
        return new Report(checkedAt, List.copyOf(checks), counts);
    }

    /** Whether any check failed (late or stale): {@code headwater check} then exits with 1. */
    @JsonIgnore
    public boolean failed() {
        return checks.stream().anyMatch(c -> c.freshnessState().fails());
    }
}
