package org.headwater.checks;

import static org.headwater.store.schema.Tables.SOURCE;

import java.io.IOException;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Observation;
import org.headwater.store.Store;

/**
 * Turns the policy file of a harvested folder, and policies people set through the API, into
 * observations. A person's policy (set by {@code api:…}) outranks the file: the file only decides for
 * datasets that have no such policy.
 */
public final class PolicySync {
    /** A policy file larger than this is not a list of rules people wrote. */
    static final long MAX_FILE_BYTES = 1024 * 1024;
    static final String API = "api:";

    private final Store store;
    private final Ingestor ingestor;

    public PolicySync(Store store, Ingestor ingestor) {
        this.store = store;
        this.ingestor = ingestor;
    }

    /** What applying a policy file did, and the lines it could not use. */
    public record FileResult(Path file, boolean found, int set, int removed, List<PolicyFile.Problem> problems) {
    }

    /**
     * Applies the policy file at the root of a harvested folder to that folder's present datasets. Without
     * a file, policies that came from a file are removed. Bad lines are reported and skipped.
     */
    public FileResult applyFile(Path folder, String origin) throws IOException {
        Path root = folder.toRealPath();
        Long sourceId = store.dsl().select(SOURCE.ID).from(SOURCE).where(SOURCE.ROOT_URI.eq(root.toUri().toString()))
                .fetchOne(SOURCE.ID);
        Path file = root.resolve(PolicyFile.NAME);
        if (sourceId == null) {
            return new FileResult(file, false, 0, 0, List.of());
        }
        List<PolicyFile.Problem> readProblems = new ArrayList<>();
        Optional<String> text = read(file, readProblems);
        boolean found = Files.isRegularFile(file);
        if (!readProblems.isEmpty()) {
            // A file that cannot be read says nothing, so the policies it set before stay as they are.
            return new FileResult(file, true, 0, 0, readProblems);
        }
        PolicyFile rules = PolicyFile.parse(text.orElse(""));
        FreshnessRecords records = new FreshnessRecords(store);
        Map<Long, FreshnessRecords.CurrentPolicy> current = records.currentPolicies();
        List<Observation> batch = new ArrayList<>();
        int set = 0;
        int removed = 0;
        for (FreshnessRecords.Present dataset : records.present(sourceId)) {
            FreshnessRecords.CurrentPolicy now = current.get(dataset.id());
            if (now != null && now.setBy().startsWith(API)) {
                continue;
            }
            Optional<PolicyFile.Rule> rule = rules.ruleFor(dataset.name());
            Optional<Policy> policy = rule.flatMap(PolicyFile.Rule::policy);
            if (policy.isPresent()) {
                String setBy = PolicyFile.NAME + " line " + rule.get().line() + " (" + rule.get().glob() + ")";
                if (now == null || !now.policy().equals(policy.get().text()) || !now.setBy().equals(setBy)) {
                    set++;
                }
                batch.add(new Observation.FreshnessPolicySet(dataset.uri(), policy.get().text(), setBy));
            } else if (now != null) {
                removed++;
                batch.add(new Observation.FreshnessPolicyRemoved(dataset.uri(), rule.isPresent()
                        ? PolicyFile.NAME + " line " + rule.get().line() + " (none)" : PolicyFile.NAME + " (no rule)"));
            }
        }
        ingestor.apply(origin, batch);
        return new FileResult(file, found, set, removed, rules.problems());
    }

    /** Sets (or, with a null policy, removes) a person's policy for one dataset. */
    public void setByPerson(String datasetUri, Policy policy, String author) {
        String setBy = API + author;
        ingestor.apply("api", List.of(policy == null ? new Observation.FreshnessPolicyRemoved(datasetUri, setBy)
                : new Observation.FreshnessPolicySet(datasetUri, policy.text(), setBy)));
    }

    private static Optional<String> read(Path file, List<PolicyFile.Problem> problems) {
        try {
            if (Files.size(file) > MAX_FILE_BYTES) {
                problems.add(new PolicyFile.Problem(0, "the file is larger than " + MAX_FILE_BYTES + " bytes; ignored"));
                return Optional.empty();
            }
            byte[] bytes = Files.readAllBytes(file);
            return Optional.of(StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .decode(java.nio.ByteBuffer.wrap(bytes)).toString());
        } catch (NoSuchFileException e) {
            return Optional.empty();
        } catch (CharacterCodingException e) {
            problems.add(new PolicyFile.Problem(0, "the file is not UTF-8 text; ignored"));
            return Optional.empty();
        } catch (IOException e) {
            problems.add(new PolicyFile.Problem(0, "the file cannot be read: " + e.getMessage()));
            return Optional.empty();
        }
    }
}
