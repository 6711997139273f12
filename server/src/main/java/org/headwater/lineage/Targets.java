package org.headwater.lineage;

import java.util.List;
import java.util.Optional;
import org.headwater.store.CatalogReader;
import org.headwater.store.OwnerReader;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;

/**
 * Finds the dataset or column a person means: a dataset id, URI, workspace-relative name, path or unique
 * end of a name; a partition of a partitioned set (meaning the set); or any of those followed by
 * {@code .column}. A dataset name may itself hold dots ({@code lab/nitrate.csv}), so the whole text is
 * tried as a dataset first and split at its last dot only when nothing matches.
 */
public final class Targets {
    private final CatalogReader reader;
    private final OwnerReader owners;
    private final LineageGraph graph;

    public Targets(CatalogReader reader, OwnerReader owners, LineageGraph graph) {
        this.reader = reader;
        this.owners = owners;
        this.graph = graph;
    }

    /** The target {@code key} names. */
    public Target resolve(String key) {
        if (key == null || key.isBlank()) {
            throw new TargetException("Name a dataset (id, URI or name) or a column (dataset.column)", false);
        }
        String text = key.trim();
        Optional<Target> whole = dataset(text);
        if (whole.isPresent()) {
            return whole.get();
        }
        int dot = text.lastIndexOf('.');
        if (dot > 0 && dot < text.length() - 1) {
            Optional<Target> holder = dataset(text.substring(0, dot));
            if (holder.isPresent()) {
                return column(holder.get(), text.substring(dot + 1));
            }
        }
        throw new TargetException("No dataset or column matches '" + text + "'; try 'headwater search'", true);
    }

    /** The target for a dataset id and an optional column, as the API's path and {@code column=} give them. */
    public Target resolve(long datasetId, String column) {
        DatasetView dataset = reader.dataset(datasetId, null)
                .orElseThrow(() -> new TargetException("No dataset with id " + datasetId, true));
        Target target = new Target(dataset.id(), dataset.name(), null, null);
        return column == null ? target : column(target, column);
    }

    private Target column(Target dataset, String column) {
        boolean inSchema = reader.dataset(dataset.datasetId(), null).orElseThrow().columns().stream()
                .anyMatch(c -> c.name().equals(column));
        if (!inSchema && !graph.hasColumn(dataset.datasetId(), column)) {
            throw new TargetException("Dataset " + dataset.dataset() + " has no column '" + column + "'", true);
        }
        return new Target(dataset.datasetId(), dataset.dataset(), column, dataset.partition());
    }

    private Optional<Target> dataset(String key) {
        if (key.chars().allMatch(Character::isDigit) && key.length() < 19) {
            return reader.dataset(Long.parseLong(key), null).map(d -> new Target(d.id(), d.name(), null, null));
        }
        List<DatasetSummary> found = reader.findDatasets(key);
        if (!found.isEmpty()) {
            DatasetSummary first = found.get(0);
            if (found.size() > 1 && !first.name().equals(key) && !first.uri().equals(key)) {
                StringBuilder list = new StringBuilder("'" + key + "' matches " + found.size() + " datasets:");
                found.forEach(d -> list.append(' ').append(d.name()).append(';'));
                throw new TargetException(list.substring(0, list.length() - 1), false);
            }
            return Optional.of(new Target(first.id(), first.name(), null, null));
        }
        return owners.setOfPartition(key).flatMap(id -> reader.dataset(id, null))
                .map(set -> new Target(set.id(), set.name(), null, key));
    }
}
