package org.headwater.harvest.config;

/** A sources file that cannot be used; the message lists every problem with its entry. */
public final class ConfigException extends IllegalArgumentException {
    public ConfigException(String message) {
        super(message);
    }
}
