package org.headwater.cli;

import org.headwater.http.Version;
import picocli.CommandLine;

/** Supplies {@code --version}. */
final class VersionProvider implements CommandLine.IVersionProvider {
    @Override
    public String[] getVersion() {
        return new String[] {"headwater " + Version.current()};
    }
}
