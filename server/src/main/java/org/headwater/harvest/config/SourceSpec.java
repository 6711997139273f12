package org.headwater.harvest.config;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Optional;
import org.headwater.harvest.NameFilter;
import org.headwater.harvest.jdbc.DatabaseSource;
import org.headwater.harvest.objectstore.ObjectStoreSettings;

/** One validated entry of the sources file. */
public sealed interface SourceSpec {

    String name();

    /** The kind word of the file: folder, s3, database. */
    String kind();

    /** How often {@code serve --config} harvests it; empty for on demand only. */
    Optional<Duration> every();

    /** A local folder. */
    record Folder(String name, Path path, NameFilter filter, boolean sampling, Optional<Duration> every)
            implements SourceSpec {
        @Override
        public String kind() {
            return "folder";
        }
    }

    /** A prefix of an S3-compatible bucket. */
    record ObjectStorePrefix(String name, ObjectStoreSettings settings, NameFilter filter, boolean sampling,
            Optional<Duration> every) implements SourceSpec {
        @Override
        public String kind() {
            return "s3";
        }
    }

    /** A database reached over JDBC. */
    record Database(DatabaseSource source, Optional<Duration> every) implements SourceSpec {
        @Override
        public String name() {
            return source.name();
        }

        @Override
        public String kind() {
            return "database";
        }
    }
}
