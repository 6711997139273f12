package org.headwater.harvest.config;

import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.jdbc.DatabaseSource;

/** Harvests a configured database; the JDBC harvester is plugged in here by whoever builds the runner. */
@FunctionalInterface
public interface DatabaseHarvests {

    /** For builds without a database harvester: every database source fails with this message. */
    DatabaseHarvests NONE = (source, progress) -> {
        throw new UnsupportedOperationException("This build has no database harvester");
    };

    HarvestSummary harvest(DatabaseSource source, HarvestProgress progress) throws Exception;
}
