package org.headwater.harvest.jdbc;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/** Runs a SQL fixture from the test resources: statements end with ';' at the end of a line, '--' comments. */
final class SqlFixture {
    private SqlFixture() {
    }

    static List<String> statements(String resource) throws IOException {
        try (InputStream in = SqlFixture.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IOException("no test resource " + resource);
            }
            StringBuilder text = new StringBuilder();
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (!line.strip().startsWith("--")) {
                    text.append(line).append('\n');
                }
            }
            List<String> out = new ArrayList<>();
            for (String s : text.toString().split(";\\s*\n")) {
                if (!s.isBlank()) {
                    out.add(s.strip());
                }
            }
            return out;
        }
    }

    static void run(Connection connection, String resource) throws IOException, SQLException {
        try (Statement s = connection.createStatement()) {
            for (String sql : statements(resource)) {
                s.execute(sql);
            }
        }
    }
}
