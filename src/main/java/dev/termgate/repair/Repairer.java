package dev.termgate.repair;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Analyzer;
import dev.termgate.analyze.Candidate;
import dev.termgate.analyze.Fix;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Node;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Deterministic repair: applies the fixes the analyzer proposes when they are certain, re-analyzes, and
 * repeats (a corrected name may reveal a direction to flip). A fix with several candidates is applied only
 * when exactly one of them, tried alone, leaves fewer errors than every other; otherwise nothing is changed and
 * its ranked candidates are handed back. A query with a write or side-effect clause is never repaired.
 */
public final class Repairer {

    /** Rounds of fix-and-reanalyze (common practice: a name fix, then a direction, then a spare). */
    static final int MAX_ROUNDS = 4;
    /** Candidates tried one by one for an uncertain fix (more than this is left to the model). */
    static final int MAX_TRIALS = 6;

    private Repairer() {}

    public static RepairResult repair(Query query, Analysis analysis, Analyzer analyzer) {
        if (!analysis.hasErrors() || refusesRepair(analysis)) {
            return new RepairResult(Optional.empty(), List.of(), analysis, analysis.fixes().stream()
                    .filter(f -> f.diagnostic().isError()).toList());
        }
        Query tree = query;
        Analysis current = analysis;
        List<Edit> edits = new ArrayList<>();
        List<Fix> unresolved = new ArrayList<>();
        for (int round = 0; round < MAX_ROUNDS && current.hasErrors(); round++) {
            unresolved.clear();
            List<Candidate> chosen = new ArrayList<>();
            for (Fix f : current.fixes()) {
                if (!f.diagnostic().isError()) continue;
                Candidate c = choose(tree, current, f, analyzer);
                if (c == null) {
                    unresolved.add(f);
                } else if (chosen.stream().noneMatch(o -> o.targets(c.target()))) {
                    chosen.add(c);
                }
            }
            if (chosen.isEmpty()) break;
            Query next = apply(tree, chosen);
            Analysis after = analyzer.analyze(next);
            if (after.errorCount() > current.errorCount()) break;
            for (Candidate c : chosen) {
                edits.add(new Edit(c.kind(), c.target().span(), c.before(), c.after(), c.reason()));
            }
            tree = next;
            current = after;
        }
        if (current.hasErrors()) {
            unresolved.clear();
            current.fixes().stream().filter(f -> f.diagnostic().isError()).forEach(unresolved::add);
        }
        return new RepairResult(edits.isEmpty() ? Optional.empty() : Optional.of(tree), edits, current, unresolved);
    }

    /** The candidate to apply for a fix, or null when it is not clear which one. */
    private static Candidate choose(Query tree, Analysis current, Fix f, Analyzer analyzer) {
        if (f.certain()) return f.candidates().get(0);
        if (f.candidates().size() > MAX_TRIALS) return null;
        long best = Long.MAX_VALUE;
        Candidate winner = null;
        boolean tie = false;
        for (Candidate c : f.candidates()) {
            long errors = analyzer.analyze(apply(tree, List.of(c))).errorCount();
            if (errors < best) {
                best = errors;
                winner = c;
                tie = false;
            } else if (errors == best) {
                tie = true;
            }
        }
        if (tie || winner == null || best >= current.errorCount()) return null;
        Candidate w = winner;
        return new Candidate(w.kind(), w.target(), w.change(), w.before(), w.after(),
                w.reason() + "; the only candidate that makes the pattern consistent", w.score());
    }

    static Query apply(Query tree, List<Candidate> chosen) {
        return Trees.rewrite(tree, n -> {
            Node out = n;
            for (Candidate c : chosen) {
                if (c.targets(out)) out = c.change().apply(out);
            }
            return out;
        });
    }

    /** Write and side-effect clauses (TG4xxx) are refused, never repaired: the query stays invalid as it is. */
    private static boolean refusesRepair(Analysis a) {
        for (Diagnostic d : a.diagnostics()) {
            if (d.isError() && d.code().number() / 1000 == 4) return true;
        }
        return false;
    }
}
