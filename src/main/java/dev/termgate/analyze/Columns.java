package dev.termgate.analyze;

import dev.termgate.query.Expr;
import dev.termgate.query.Trees;

/** The column name an unaliased RETURN item gets, used to compare the columns of UNION parts. */
final class Columns {
    private Columns() {}

    static String name(Expr e) {
        return String.valueOf(Trees.stripSpans(e));
    }
}
