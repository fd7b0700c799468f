package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Expr;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;

/** Every function called must be an openCypher standard function, with an allowed number of arguments. */
final class FunctionCheck implements Check {
    @Override
    public void run(Query query, Context cx) {
        for (Expr.FunctionCall f : cx.nodes(query, Expr.FunctionCall.class)) {
            Functions.Signature sig = Functions.lookup(f.qualifiedName());
            if (sig == null) {
                cx.report(Diagnostic.of(Code.UNKNOWN_FUNCTION, f, f.qualifiedName())
                        .withSuggestions(Functions.near(f.qualifiedName())));
            } else if (f.args().size() < sig.min() || sig.max() >= 0 && f.args().size() > sig.max()) {
                cx.report(Diagnostic.of(Code.WRONG_ARGUMENT_COUNT, f, sig.name(), sig.arity(), f.args().size()));
            }
        }
    }
}
