package org.headwater.ingest;

/** Short names for datasets known only by URI. */
final class DatasetNames {
    private DatasetNames() {
    }

    /** The last two path segments of a URI, which is what people usually recognise a file by. */
    static String fallbackName(String uri) {
        String path = uri.replaceFirst("^[a-z][a-z0-9+.-]*:(//)?", "");
        String[] parts = path.split("/");
        if (parts.length >= 2) {
            return parts[parts.length - 2] + "/" + parts[parts.length - 1];
        }
        return path;
    }
}
