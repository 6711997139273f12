package org.headwater.checks;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;

/** The hive fixture for tests in other packages. */
public final class HiveWorkspaceAccess {
    private HiveWorkspaceAccess() {
    }

    public static Path write(Path root) throws IOException {
        return HiveWorkspace.write(root);
    }

    public static Instant now() {
        return HiveWorkspace.NOW;
    }
}
