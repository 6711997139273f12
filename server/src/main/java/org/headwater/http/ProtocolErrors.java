package org.headwater.http;

import com.fasterxml.jackson.databind.ObjectMapper;
import io.javalin.http.HttpStatus;
import java.io.IOException;
import java.nio.ByteBuffer;
import org.eclipse.jetty.http.HttpHeader;
import org.eclipse.jetty.server.Request;
import org.eclipse.jetty.server.Response;
import org.eclipse.jetty.server.handler.ErrorHandler;
import org.eclipse.jetty.util.Callback;

/**
 * Jetty's answer to requests that never reach a route (a malformed URI, an illegal path, a bad header):
 * the same RFC 9457 problem document and security headers as every other error, instead of Jetty's
 * HTML page, so a client has one error format to read.
 */
final class ProtocolErrors extends ErrorHandler {
    private final ObjectMapper mapper;

    ProtocolErrors(ObjectMapper mapper) {
        this.mapper = mapper;
    }

    @Override
    protected void generateResponse(Request request, Response response, int code, String message, Throwable cause,
            Callback callback) throws IOException {
        String detail = "The server could not read the request: "
                + (message == null || message.isBlank() ? HttpStatus.forStatus(code).getMessage() : message);
        // The URI may be the malformed part, so the instance is left out rather than echoed.
        Problem problem = Problem.of(code, Errors.codeFor(code), detail, null);
        byte[] body = mapper.writeValueAsBytes(problem);
        response.getHeaders().put(HttpHeader.CONTENT_TYPE, Problem.MEDIA_TYPE + ";charset=utf-8");
        SecurityHeaders.HEADERS.forEach((name, value) -> response.getHeaders().put(name, value));
        response.write(true, ByteBuffer.wrap(body), callback);
    }
}
