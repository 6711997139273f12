package org.headwater.checks;

import com.fasterxml.jackson.annotation.JsonProperty;

/** A dataset whose state changed at a recorded check; {@code previousState} is null at its first check. */
public record Transition(@JsonProperty("previousState") String previousState, @JsonProperty("check") Check check) {
}
