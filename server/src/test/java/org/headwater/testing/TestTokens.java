package org.headwater.testing;

import java.time.Clock;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.access.Tokens;

/** Creates API tokens in a test catalog, as {@code headwater token create} does. */
public final class TestTokens {
    private TestTokens() {
    }

    /** A new token's secret, never expiring. */
    public static String create(Catalog catalog, Role role) {
        return new Tokens(catalog.store(), Clock.systemUTC()).create("test " + role.word(), role, null).secret();
    }

    /** The header value that carries a token. */
    public static String bearer(String secret) {
        return "Bearer " + secret;
    }
}
