package org.headwater.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.concurrent.Callable;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.headwater.access.Audit;
import org.headwater.access.Role;
import org.headwater.access.Tokens;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code headwater token create|list|revoke}: API tokens, managed on the catalog directory itself (so
 * whoever may administer the server's files may manage its tokens; there is no API for it).
 */
@Command(name = "token", mixinStandardHelpOptions = true,
        description = "Create, list and revoke API tokens of the catalog in --data-dir.",
        subcommands = {TokenCommand.Create.class, TokenCommand.ListTokens.class, TokenCommand.Revoke.class})
final class TokenCommand implements Runnable {
    private static final Pattern DURATION = Pattern.compile("(\\d{1,6})([dhm])");

    @Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "Name a subcommand: create, list or revoke.");
    }

    /** The catalog's store, created when new: tokens are often made before the first {@code serve}. */
    static Store open(CatalogOptions catalog) {
        Path dir = catalog.dataDir.toAbsolutePath().normalize();
        try {
            Files.createDirectories(dir);
        } catch (java.io.IOException e) {
            throw new Problems.UsageProblem("cannot create the catalog directory " + dir + ": " + e.getMessage());
        }
        return Store.open(StoreConfig.embedded(dir));
    }

    /** {@code 30d}, {@code 12h} or {@code 90m}. */
    static Duration duration(String text) {
        Matcher m = DURATION.matcher(text.trim());
        if (!m.matches()) {
            throw new Problems.UsageProblem("--expires takes a number and d, h or m, such as 30d; got '" + text + "'");
        }
        long n = Long.parseLong(m.group(1));
        return switch (m.group(2)) {
            case "d" -> Duration.ofDays(n);
            case "h" -> Duration.ofHours(n);
            default -> Duration.ofMinutes(n);
        };
    }

    /** {@code token create}: prints the secret once. */
    @Command(name = "create", mixinStandardHelpOptions = true,
            description = {"Create a token and print its secret. The secret is shown only this once;",
                    "the catalog keeps only its SHA-256."})
    static final class Create implements Callable<Integer> {
        @Option(names = "--role", required = true, paramLabel = "ROLE",
                description = "reader, editor, harvester or admin.")
        String role;

        @Option(names = "--expires", paramLabel = "AGE", description = "Lifetime such as 30d, 12h, 90m (default: none).")
        String expires;

        @Option(names = "--name", paramLabel = "NAME", defaultValue = "unnamed",
                description = "Who or what holds it, for lists and the audit log.")
        String name;

        @Mixin
        CatalogOptions catalog;

        @Mixin
        Output output;

        @Spec
        CommandLine.Model.CommandSpec spec;

        @Override
        public Integer call() {
            Role parsed;
            try {
                parsed = Role.of(role);
            } catch (IllegalArgumentException e) {
                throw new Problems.UsageProblem(e.getMessage());
            }
            Duration validFor = expires == null ? null : duration(expires);
            try (Store store = open(catalog)) {
                Tokens.Created created = new Tokens(store, Clock.systemUTC()).create(name, parsed, validFor);
                new Audit(store, Clock.systemUTC()).record(null, "command line", "token.create",
                        "token " + created.token().id(), null, null, parsed.word() + " token '" + name + "'");
                var out = spec.commandLine().getOut();
                if (output.json) {
                    Output.printJson(out, created);
                } else {
                    out.printf("Token %d (%s, %s%s):%n%s%nKeep it now: it is not shown again.%n",
                            created.token().id(), name, parsed.word(),
                            created.token().expiresAt() == null ? ", no expiry" : ", expires " + created.token().expiresAt(),
                            created.secret());
                    out.flush();
                }
            }
            return Main.OK;
        }
    }

    /** {@code token list}: never shows secrets. */
    @Command(name = "list", mixinStandardHelpOptions = true, description = "List tokens (never their secrets).")
    static final class ListTokens implements Callable<Integer> {
        @Mixin
        CatalogOptions catalog;

        @Mixin
        Output output;

        @Spec
        CommandLine.Model.CommandSpec spec;

        @Override
        public Integer call() {
            try (Store store = open(catalog)) {
                var tokens = new Tokens(store, Clock.systemUTC()).list();
                var out = spec.commandLine().getOut();
                if (output.json) {
                    Output.printJson(out, tokens);
                    return Main.OK;
                }
                var now = java.time.Instant.now();
                for (Tokens.Token t : tokens) {
                    String state = t.revokedAt() != null ? "revoked " + t.revokedAt()
                            : !t.usableAt(now) ? "expired " + t.expiresAt()
                            : t.expiresAt() == null ? "active" : "active until " + t.expiresAt();
                    out.printf("%5d  %-9s  %-24s  %s; last used %s%n", t.id(), t.role().word(), t.name(), state,
                            t.lastUsedAt() == null ? "never" : t.lastUsedAt());
                }
                out.flush();
            }
            return Main.OK;
        }
    }

    /** {@code token revoke ID}. */
    @Command(name = "revoke", mixinStandardHelpOptions = true, description = "Revoke a token: it stops working at once.")
    static final class Revoke implements Callable<Integer> {
        @Parameters(paramLabel = "ID", description = "The token's number, from 'token list'.")
        long id;

        @Mixin
        CatalogOptions catalog;

        @Spec
        CommandLine.Model.CommandSpec spec;

        @Override
        public Integer call() {
            try (Store store = open(catalog)) {
                if (!new Tokens(store, Clock.systemUTC()).revoke(id)) {
                    throw new Problems.UsageProblem("no active token " + id);
                }
                new Audit(store, Clock.systemUTC()).record(null, "command line", "token.revoke", "token " + id, null,
                        null, null);
            }
            spec.commandLine().getOut().printf("Token %d revoked.%n", id);
            spec.commandLine().getOut().flush();
            return Main.OK;
        }
    }
}
