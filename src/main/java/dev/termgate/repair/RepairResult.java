package dev.termgate.repair;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Fix;
import dev.termgate.query.Query;

import java.util.List;
import java.util.Optional;

/**
 * What a repair did.
 *
 * @param tree       the repaired tree, present when at least one edit was made
 * @param edits      the edits in the order they were made
 * @param after      the analysis of the repaired tree (of the original one when nothing was repaired)
 * @param unresolved fixes that were not certain: their ranked candidates are for the person or model to choose
 */
public record RepairResult(Optional<Query> tree, List<Edit> edits, Analysis after, List<Fix> unresolved) {
    public RepairResult {
        edits = List.copyOf(edits);
        unresolved = List.copyOf(unresolved);
    }

    public boolean repaired() {
        return tree.isPresent();
    }
}
