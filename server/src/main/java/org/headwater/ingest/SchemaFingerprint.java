package org.headwater.ingest;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import org.headwater.model.ColumnDef;

/** A short, stable digest of a column structure, so that "did the schema change?" is one comparison. */
final class SchemaFingerprint {
    private SchemaFingerprint() {
    }

    static String of(List<ColumnDef> columns) {
        StringBuilder text = new StringBuilder();
        for (ColumnDef c : columns) {
            // Unit and record separators cannot occur in column names read from text files.
            text.append(c.name()).append('\u001f').append(c.dataType()).append('\u001f')
                    .append(c.nullable()).append('\u001e');
        }
        return sha256(text.toString());
    }

    static String sha256(String text) {
        try {
            MessageDigest digest = MessageDigest.getInstance("SHA-256");
            return HexFormat.of().formatHex(digest.digest(text.getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
