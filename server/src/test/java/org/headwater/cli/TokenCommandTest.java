package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import org.headwater.Catalog;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code headwater token} and {@code headwater audit} on a catalog directory. */
class TokenCommandTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;



    @Test
    void createListRevokeAndAuditATokenOnTheDataDirectory() throws Exception {
        String dir = temp.resolve("catalog").toString();
        Catalog.open(Path.of(dir)).close();
        Instant before = Instant.now();
        Ran created = run("token", "create", "--role", "harvester", "--name", "lab scheduler", "--expires", "30d",
                "--data-dir", dir, "--json");
        assertThat(created.exit()).as(created.err()).isZero();
        JsonNode made = JSON.readTree(created.out());
        String secret = made.get("secret").asText();
        assertThat(secret).startsWith("hw_");
        assertThat(made.get("token").get("role").asText()).isEqualTo("harvester");
        Instant expires = Instant.parse(made.get("token").get("expires_at").asText());
        // 30 days from the moment of creation, which lies between `before` and now
        assertThat(expires).isBetween(before.plus(Duration.ofDays(30)), Instant.now().plus(Duration.ofDays(30)));
        long id = made.get("token").get("id").asLong();

        Ran listed = run("token", "list", "--data-dir", dir, "--json");
        assertThat(listed.exit()).isZero();
        assertThat(listed.out()).doesNotContain(secret);
        assertThat(JSON.readTree(listed.out()).get(0).get("name").asText()).isEqualTo("lab scheduler");

        assertThat(run("token", "revoke", Long.toString(id), "--data-dir", dir).exit()).isZero();
        assertThat(run("token", "revoke", Long.toString(id), "--data-dir", dir).exit()).isEqualTo(Main.USAGE);
        assertThat(run("token", "list", "--data-dir", dir).out()).contains("revoked");

        Ran audit = run("audit", "--data-dir", dir, "--json");
        assertThat(audit.exit()).isZero();
        assertThat(JSON.readTree(audit.out())).extracting(e -> e.get("action").asText())
                .containsExactly("token.revoke", "token.create");
        assertThat(audit.out()).doesNotContain(secret);
    }

    @Test
    void anUnknownRoleOrLifetimeIsAUsageError() {
        String dir = temp.resolve("catalog").toString();
        Catalog.open(Path.of(dir)).close();
        Ran role = run("token", "create", "--role", "owner", "--data-dir", dir);
        assertThat(role.exit()).isEqualTo(Main.USAGE);
        assertThat(role.err()).contains("roles are reader, editor, harvester, admin");
        assertThat(run("token", "create", "--role", "reader", "--expires", "soon", "--data-dir", dir).exit())
                .isEqualTo(Main.USAGE);
    }
}
