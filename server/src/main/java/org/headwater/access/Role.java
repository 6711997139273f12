package org.headwater.access;

import io.javalin.security.RouteRole;
import java.util.Locale;
import java.util.Set;

/**
 * What a token may do. A route declares the one role it needs; {@link #grants} says which token roles
 * satisfy it. Admin satisfies every role; editor and harvester both include reader.
 */
public enum Role implements RouteRole {
    /** Read everything a reader may read (also what anonymous callers get when anonymous read is on). */
    READER(Set.of()),
    /** Change descriptions, tags and owners. */
    EDITOR(Set.of(READER)),
    /** Send run records and start harvests: what connectors and scheduled harvesters hold. */
    HARVESTER(Set.of(READER)),
    /** Everything, including the audit log. Tokens themselves are managed on the data directory. */
    ADMIN(Set.of(READER, EDITOR, HARVESTER));

    private final Set<Role> includes;

    Role(Set<Role> includes) {
        this.includes = includes;
    }

    /** Whether a token of this role may call a route that needs {@code required}. */
    public boolean grants(Role required) {
        return this == required || includes.contains(required);
    }

    /** The lower-case word used on the command line, in the store and in answers. */
    @com.fasterxml.jackson.annotation.JsonValue
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The role a word names, or an {@link IllegalArgumentException} that lists the words. */
    public static Role of(String word) {
        for (Role role : values()) {
            if (role.word().equals(word.trim().toLowerCase(Locale.ROOT))) {
                return role;
            }
        }
        throw new IllegalArgumentException("Unknown role '" + word + "'; roles are reader, editor, harvester, admin");
    }
}
