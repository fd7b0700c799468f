package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Clause;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;

/**
 * The security boundary: every clause that writes or reaches outside the graph is an error, wherever it
 * stands (also inside subqueries and FOREACH). No option turns this off; repair never removes such a clause.
 */
final class ReadOnlyCheck implements Check {
    @Override
    public void run(Query query, Context cx) {
        for (Clause c : cx.nodes(query, Clause.class)) {
            if (!c.isWrite()) continue;
            cx.report(diagnostic(c));
        }
    }

    static Diagnostic diagnostic(Clause c) {
        if (c instanceof Clause.Create) return Diagnostic.of(Code.WRITE_CLAUSE, c, "CREATE");
        if (c instanceof Clause.Merge) return Diagnostic.of(Code.MERGE_CLAUSE, c);
        if (c instanceof Clause.SetClause) return Diagnostic.of(Code.SET_CLAUSE, c);
        if (c instanceof Clause.Remove) return Diagnostic.of(Code.REMOVE_CLAUSE, c);
        if (c instanceof Clause.Delete d) return Diagnostic.of(Code.DELETE_CLAUSE, c, d.detach() ? "DETACH DELETE" : "DELETE");
        if (c instanceof Clause.Foreach) return Diagnostic.of(Code.FOREACH_CLAUSE, c);
        if (c instanceof Clause.LoadCsv) return Diagnostic.of(Code.LOAD_CSV, c);
        if (c instanceof Clause.CallProcedure p) {
            String name = p.namespace().isEmpty() ? p.name() : String.join(".", p.namespace()) + "." + p.name();
            return Diagnostic.of(Code.PROCEDURE_CALL, c, name);
        }
        if (c instanceof Clause.CallSubquery) return Diagnostic.of(Code.SUBQUERY_CALL, c);
        // A write clause kind added to the tree later is still refused.
        return Diagnostic.of(Code.WRITE_CLAUSE, c, c.getClass().getSimpleName().toUpperCase(java.util.Locale.ROOT));
    }
}
