package dev.termgate.analyze;

import dev.termgate.diag.Diagnostic;

import java.util.List;

/**
 * The ways a diagnostic could be repaired, best first. A fix is {@link #certain()} when it has one candidate
 * or its best candidate scores clearly above the next; otherwise a repair may still pick the one candidate
 * that alone makes the query valid, and hands the rest back as ranked suggestions.
 */
public record Fix(Diagnostic diagnostic, List<Candidate> candidates) {

    /** Score gap that counts as "clearly ahead" (common practice: one similarity tier, see {@code Lenient}). */
    static final double CLEAR_MARGIN = 0.1;

    public Fix {
        candidates = List.copyOf(candidates);
    }

    public boolean certain() {
        if (candidates.isEmpty()) return false;
        return candidates.size() == 1 || candidates.get(0).score() - candidates.get(1).score() >= CLEAR_MARGIN - 1e-9;
    }
}
