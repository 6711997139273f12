package org.headwater.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.PrintWriter;
import org.headwater.http.ApiJson;
import picocli.CommandLine.Option;

/** The {@code --json} option, and printing in the API's JSON style. */
final class Output {
    private static final ObjectMapper JSON = ApiJson.mapper().enable(SerializationFeature.INDENT_OUTPUT);

    @Option(names = "--json", description = "Print the result as JSON (the same shapes as the HTTP API).")
    boolean json;

    static void printJson(PrintWriter out, Object value) {
        try {
            out.println(JSON.writeValueAsString(value));
            out.flush();
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("Result not representable as JSON", e);
        }
    }
}
