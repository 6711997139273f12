package org.headwater.export;

import java.nio.charset.StandardCharsets;

/** Turns catalog identifiers into IRIs an RDF parser accepts. */
final class Iris {
    /** Our own namespace for terms PROV-O has no word for (evidence, confidence, kind). */
    static final String VOCAB = "urn:headwater:vocab:";

    private Iris() {
    }

    /**
     * Dataset and script URIs are already absolute ({@code file:}, {@code sqltable:}, {@code s3:}); only the
     * characters RFC 3987 section 2.2 excludes from an IRI (space, {@code <>"{}|\^`} and controls) are
     * percent-encoded, so every URI stays recognisable.
     */
    static String of(String uri) {
        StringBuilder out = new StringBuilder(uri.length());
        for (byte b : uri.getBytes(StandardCharsets.UTF_8)) {
            int c = b & 0xff;
            if (c <= 0x20 || c == 0x7f || "<>\"{}|\\^`".indexOf(c) >= 0) {
                out.append('%').append(Character.toUpperCase(Character.forDigit(c >> 4, 16)))
                        .append(Character.toUpperCase(Character.forDigit(c & 0xf, 16)));
            } else {
                out.append((char) c);
            }
        }
        // Non-ASCII bytes were appended one per char above; decode them back so IRIs keep their letters.
        return new String(out.toString().getBytes(StandardCharsets.ISO_8859_1), StandardCharsets.UTF_8);
    }

    static String run(String runId) {
        return "urn:headwater:run:" + of(runId);
    }

    static String owner(String name) {
        return "urn:headwater:owner:" + of(name);
    }

    static String person(String user) {
        return "urn:headwater:user:" + of(user);
    }
}
