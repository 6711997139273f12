package org.headwater.cli;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/** The {@code headwater} command: entry point of the runnable jar. */
@Command(name = "headwater", mixinStandardHelpOptions = true, versionProvider = VersionProvider.class,
        description = "A lineage-aware catalog of a team's files, tables and scripts.",
        subcommands = {ServeCommand.class, HarvestCommand.class, SearchCommand.class, ShowCommand.class,
                ReindexCommand.class, LineageCommand.class, ReadsCommand.class, WhenceCommand.class, SniffCommand.class,
                ExportCommand.class, ImportCommand.class, BackupCommand.class, RestoreCommand.class,
                CheckCommand.class,
                UpstreamCommand.class, DownstreamCommand.class, ImpactCommand.class, OwnCommand.class,
                TokenCommand.class, AuditCommand.class, DemoCommand.class, CommandLine.HelpCommand.class})
public final class Main implements Runnable {

    /** Exit codes of every command. */
    public static final int OK = 0;
    public static final int PROBLEMS = 1;
    public static final int USAGE = 2;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    static {
        // jOOQ prints a logo and tips at first use; in a command-line tool that is noise and start-up time.
        System.setProperty("org.jooq.no-logo", "true");
        System.setProperty("org.jooq.no-tips", "true");
        // Before any logger exists: HEADWATER_LOG_FORMAT=json gives one JSON object per log line.
        if ("json".equalsIgnoreCase(System.getenv("HEADWATER_LOG_FORMAT"))
                && System.getProperty("logback.configurationFile") == null) {
            System.setProperty("logback.configurationFile", "headwater-logback-json.xml");
        }
    }

    public static void main(String[] args) {
        System.exit(run(args));
    }

    /** Runs a command line and returns its exit code; tests call this instead of {@link #main}. */
    public static int run(String... args) {
        return run(new java.io.PrintWriter(System.out, true), new java.io.PrintWriter(System.err, true), args);
    }

    /** Runs a command line writing to the given streams. */
    public static int run(java.io.PrintWriter out, java.io.PrintWriter err, String... args) {
        CommandLine cli = new CommandLine(new Main()).setOut(out).setErr(err);
        cli.setExitCodeExceptionMapper(e -> e instanceof CommandLine.ParameterException ? USAGE : PROBLEMS);
        cli.setExecutionExceptionHandler((e, commandLine, parseResult) -> {
            commandLine.getErr().println("headwater: " + Problems.describe(e));
            return Problems.exitCode(e);
        });
        return cli.execute(args);
    }

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "Name a command; see 'headwater --help'.");
    }
}
