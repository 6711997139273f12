package org.headwater.harvest.config;

import java.nio.file.Files;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.headwater.Catalog;
import org.headwater.harvest.FolderHarvester;
import org.headwater.harvest.HarvestFailedException;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.LocalFolder;
import org.headwater.harvest.objectstore.ObjectStore;
import org.headwater.ingest.HarvestJournal;

/**
 * Harvests configured sources one after another. Each source ends with a harvest record: ok, with errors,
 * or failed with a message; a failure is that source's alone and the next source runs. A source that fails
 * before or during its listing has observed nothing, so its catalog state stays as the last harvest left it.
 */
public final class SourceRunner {

    /**
     * How one source's harvest ended.
     *
     * @param summary the harvest's summary, or null when it failed
     * @param message why it failed, or null
     */
    public record Outcome(String source, String kind, String status, Long harvestId, HarvestSummary summary,
            String message) {
        public boolean failed() {
            return HarvestJournal.FAILED.equals(status);
        }
    }

    private final Catalog catalog;
    private final DatabaseHarvests databases;
    private final Function<String, String> env;

    /** @param env looks up environment variables named in the file ({@code System::getenv}) */
    public SourceRunner(Catalog catalog, DatabaseHarvests databases, Function<String, String> env) {
        this.catalog = catalog;
        this.databases = databases;
        this.env = env;
    }

    /**
     * Harvests every source of the file, or only the one named.
     *
     * @throws ConfigException when {@code only} names no source of the file
     */
    public List<Outcome> run(SourcesConfig config, String only, boolean full, Function<SourceSpec, HarvestProgress> progress) {
        List<SourceSpec> chosen = new ArrayList<>();
        if (only == null) {
            chosen.addAll(config.sources());
        } else {
            chosen.add(config.source(only).orElseThrow(() -> new ConfigException("No source named '" + only
                    + "' in the file; it has " + config.sources().stream().map(SourceSpec::name).toList())));
        }
        List<Outcome> outcomes = new ArrayList<>();
        for (SourceSpec spec : chosen) {
            outcomes.add(run(spec, full, progress.apply(spec)));
        }
        return outcomes;
    }

    public Outcome run(SourceSpec spec, boolean full, HarvestProgress progress) {
        Outcome outcome = attempt(spec, full, progress);
        if (outcome.harvestId() != null) {
            catalog.recordRunAs(outcome.harvestId(), spec.name());
        }
        return outcome;
    }

    private Outcome attempt(SourceSpec spec, boolean full, HarvestProgress progress) {
        try {
            HarvestSummary summary;
            if (spec instanceof SourceSpec.Folder f) {
                summary = folder(f, full, progress);
            } else if (spec instanceof SourceSpec.ObjectStorePrefix o) {
                summary = objectStore(o, full, progress);
            } else {
                summary = databases.harvest(((SourceSpec.Database) spec).source(), progress);
            }
            return new Outcome(spec.name(), spec.kind(), summary.status(), summary.harvestId(), summary,
                    failureMessage(summary));
        } catch (HarvestFailedException e) {
            // The pipeline has already written the failure on its own harvest record.
            return new Outcome(spec.name(), spec.kind(), HarvestJournal.FAILED, e.harvestId(), null, e.getMessage());
        } catch (Exception e) {
            String message = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
            long id = catalog.recordFailedHarvest(spec.name(), spec.kind(), rootUri(spec), message);
            return new Outcome(spec.name(), spec.kind(), HarvestJournal.FAILED, id, null, message);
        }
    }

    /** A harvester that reports its failure in the summary (the database one) names the reason in its first error. */
    private static String failureMessage(HarvestSummary summary) {
        if (!HarvestJournal.FAILED.equals(summary.status())) {
            return null;
        }
        return summary.firstErrors().isEmpty() ? "failed without a recorded reason"
                : summary.firstErrors().get(0).message();
    }

    private HarvestSummary folder(SourceSpec.Folder f, boolean full, HarvestProgress progress) throws Exception {
        if (!Files.isDirectory(f.path())) {
            throw new java.nio.file.NoSuchFileException(f.path().toString(), null, "not a directory");
        }
        FolderHarvester.Options options = catalog.harvestOptions(full).withFilter(f.filter()).withSampling(f.sampling());
        LocalFolder backend = new LocalFolder(f.path().toRealPath(), options.excluded());
        return catalog.harvest(backend, f.name(), options, progress);
    }

    private HarvestSummary objectStore(SourceSpec.ObjectStorePrefix o, boolean full, HarvestProgress progress)
            throws Exception {
        FolderHarvester.Options options = catalog.harvestOptions(full).withFilter(o.filter()).withSampling(o.sampling())
                // Object reads wait on the network, not the CPU: more of them at once than there are cores.
                .withSampleBytes(o.settings().sampleBytes()).withThreads(8);
        try (ObjectStore store = ObjectStore.open(o.settings(), env, options.threads())) {
            return catalog.harvest(store, o.name(), options, progress);
        }
    }

    /** Where a source's data lives, with no secret in it (a database URL loses its password). */
    public static String rootUri(SourceSpec spec) {
        if (spec instanceof SourceSpec.Folder f) {
            return f.path().toUri().toString();
        }
        if (spec instanceof SourceSpec.ObjectStorePrefix o) {
            return o.settings().url();
        }
        // The same root the database harvester registers, so a failure lands on that source's row.
        return ((SourceSpec.Database) spec).source().safeUrl();
    }
}
