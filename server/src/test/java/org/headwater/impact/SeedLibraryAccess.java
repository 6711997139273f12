package org.headwater.impact;

import java.io.IOException;
import java.nio.file.Path;

/** The seed-library fixture for tests in other packages. */
public final class SeedLibraryAccess {
    private SeedLibraryAccess() {
    }

    public static Path copy(Path temp) throws IOException {
        return SeedLibrary.copy(temp);
    }
}
