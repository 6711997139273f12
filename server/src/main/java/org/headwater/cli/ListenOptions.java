package org.headwater.cli;

import org.headwater.http.ApiServer;
import picocli.CommandLine.Option;

/** The {@code --host} and {@code --port} options of the commands that serve. */
final class ListenOptions {
    @Option(names = "--host", paramLabel = "ADDRESS", defaultValue = ApiServer.DEFAULT_HOST,
            description = "Address to listen on (default ${DEFAULT-VALUE}).")
    String host;

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "" + ApiServer.DEFAULT_PORT,
            description = "Port to listen on (default ${DEFAULT-VALUE}; 0 picks a free one).")
    int port;
}
