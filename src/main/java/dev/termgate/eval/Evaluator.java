package dev.termgate.eval;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Trees;
import dev.termgate.translate.Checked;
import dev.termgate.translate.Outcome;
import dev.termgate.translate.QueryGate;
import dev.termgate.translate.QueryRunner;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.RunResult;
import dev.termgate.translate.ServiceFailure;
import dev.termgate.translate.TranslationLoop;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * Evaluates questions one by one: the gold query through the same gate and runner as the candidate (an invalid
 * or failing gold is reported as bad gold, not held against the translator), the question through the
 * translation loop, and the two results compared with {@link RowMatch}.
 */
public final class Evaluator {

    private final TranslationLoop loop;
    private final QueryGate gate;
    private final QueryRunner runner;
    private final RunLimits limits;

    public Evaluator(TranslationLoop loop, QueryGate gate, QueryRunner runner, RunLimits limits) {
        this.loop = loop;
        this.gate = gate;
        this.runner = runner;
        this.limits = limits;
    }

    public EvalResult evaluate(EvalQuestion q) throws InterruptedException {
        long t0 = System.nanoTime();
        Checked gold = gate.check(q.gold());
        String badGold = null;
        RunResult goldRows = null;
        if (!gold.valid()) {
            badGold = "the gold query is invalid: " + firstError(gold.diagnostics());
        } else if (!gold.edits().isEmpty()) {
            // A repaired gold is the repairer's guess at what its author meant, not a reference to score against.
            badGold = "the gold query is invalid as written (a repair would change it: "
                    + String.join("; ", gold.edits().stream().map(Checked.Edit::toString).toList()) + ")";
        } else {
            goldRows = runner.run(gold, limits);
            if (goldRows.failed()) badGold = "the gold query failed: " + firstError(goldRows.diagnostics());
            else if (goldRows.truncated()) badGold = "the gold query returned more rows than the row cap";
        }
        long t1 = System.nanoTime();
        Outcome o;
        try {
            o = loop.translate(q.question());
        } catch (ServiceFailure f) {
            return new EvalResult(q.id(), q.question(), q.shape(), q.split(),
                    badGold != null ? EvalResult.Status.BAD_GOLD : EvalResult.Status.SERVICE_FAILED, false, false, false, 0,
                    List.of(), null, null, ms(System.nanoTime() - t1), ms(System.nanoTime() - t0), Optional.empty(), q.gold(),
                    badGold != null ? badGold : "the model service failed: " + f.getMessage(), List.of());
        }
        long translateMs = ms(System.nanoTime() - t1);
        boolean asWritten = false;
        boolean afterRepair = false;
        if (!o.attempts().isEmpty() && o.attempts().get(0).checked().isPresent()) {
            Checked first = o.attempts().get(0).checked().get();
            afterRepair = first.valid();
            asWritten = first.valid() && first.edits().isEmpty();
        }
        List<String> repairs = new ArrayList<>();
        List<Checked.TermUse> terms = List.of();
        if (o.accepted().isPresent()) {
            for (Checked.Edit e : o.accepted().get().edits()) repairs.add(kind(e));
            terms = o.accepted().get().terms();
        }
        Integer pt = o.promptTokens().isPresent() ? o.promptTokens().getAsInt() : null;
        Integer ct = o.completionTokens().isPresent() ? o.completionTokens().getAsInt() : null;
        Optional<String> query = o.accepted().map(Checked::query).or(o::lastQuery);

        EvalResult.Status status;
        String detail;
        if (badGold != null) {
            status = EvalResult.Status.BAD_GOLD;
            detail = badGold;
        } else if (o.accepted().isEmpty()) {
            boolean declined = o.diagnostics().stream().anyMatch(d -> d.code() == Code.NOT_UNDERSTOOD);
            status = declined ? EvalResult.Status.NOT_UNDERSTOOD : EvalResult.Status.INVALID;
            detail = firstError(o.diagnostics());
        } else {
            RunResult rows = runner.run(o.accepted().get(), limits);
            if (rows.failed()) {
                status = EvalResult.Status.RUN_FAILED;
                detail = firstError(rows.diagnostics());
            } else {
                boolean same = RowMatch.same(goldRows.rows(), rows.rows(), sortColumns(gold));
                status = same ? EvalResult.Status.CORRECT : EvalResult.Status.WRONG;
                detail = same ? "" : String.format(Locale.ROOT, "%d row(s) × %d column(s); gold %d row(s) × %d column(s)",
                        rows.rows().size(), rows.columns().size(), goldRows.rows().size(), goldRows.columns().size());
            }
        }
        return new EvalResult(q.id(), q.question(), q.shape(), q.split(), status, asWritten, afterRepair, o.valid(),
                o.attempts().size(), repairs, pt, ct, translateMs, ms(System.nanoTime() - t0), query, q.gold(), detail, terms);
    }

    /**
     * The repair's kind: its description up to the first quoted term ("replace label 'Vesel' → 'Vessel'" →
     * "replace label", "flip direction 'r' …" → "flip direction"), so that kinds group as the repairer names them.
     */
    static String kind(Checked.Edit e) {
        String w = e.what().strip();
        int quote = w.indexOf('\'');
        String head = (quote < 0 ? w : w.substring(0, quote)).strip().toLowerCase(Locale.ROOT);
        return head.isEmpty() || !Character.isLetter(head.charAt(0)) ? "other" : head;
    }

    /**
     * The gold's sort keys as result columns: an ORDER BY item naming a column alias, or repeating a returned
     * expression; -1 for a key that is not a column. Empty when the gold does not order.
     */
    static List<Integer> sortColumns(Checked gold) {
        return gold.tree().map(Evaluator::sortColumns).orElse(List.of());
    }

    /** See {@link #sortColumns(Checked)}. */
    public static List<Integer> sortColumns(Query q) {
        if (!q.unions().isEmpty()) return List.of();
        SingleQuery last = q.first();
        if (last.clauses().isEmpty() || !(last.clauses().get(last.clauses().size() - 1) instanceof Clause.Return ret)) return List.of();
        Clause.Projection p = ret.projection();
        List<Integer> out = new ArrayList<>();
        for (Clause.SortItem s : p.orderBy()) {
            int found = -1;
            for (int i = 0; i < p.items().size() && found < 0; i++) {
                Clause.ProjectionItem item = p.items().get(i);
                if (s.expr() instanceof Expr.Variable v && item.alias().map(a -> a.name().equals(v.name())).orElse(false)) found = i;
                else if (Trees.equalIgnoringSpans(s.expr(), item.expr())) found = i;
            }
            out.add(found);
        }
        return out;
    }

    private static String firstError(List<Diagnostic> ds) {
        return ds.stream().filter(Diagnostic::isError).findFirst().or(() -> ds.stream().findFirst())
                .map(d -> d.code().id() + " " + d.message()).orElse("no detail");
    }

    private static long ms(long nanos) {
        return nanos / 1_000_000;
    }
}
