package org.headwater.cli;

import org.headwater.Catalog;
import org.headwater.harvest.config.DatabaseHarvests;

/** Which database harvester configured sources use; the one place that wires it for the CLI. */
final class Databases {
    private Databases() {
    }

    static DatabaseHarvests of(Catalog catalog) {
        return catalog::harvestDatabase;
    }
}
