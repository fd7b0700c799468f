package dev.termgate.engine;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/**
 * Rows in a form two runs of a query can be compared in when openCypher leaves their order open: each row as
 * text ({@link Values#literal} tells 1 from 1.0), collected lists as sorted multisets, since collect() keeps the
 * order rows arrive in, which a MATCH without ORDER BY leaves open (and plans change).
 */
final class RowBags {
    private RowBags() {}

    /** The rows as text with their lists as multisets, in the rows' order. */
    static List<String> canonical(List<List<Object>> rows) {
        List<String> out = new ArrayList<>(rows.size());
        for (List<Object> row : rows) {
            List<Object> canon = new ArrayList<>(row.size());
            for (Object v : row) canon.add(v instanceof List<?> l ? sortedLiterals(l) : v);
            out.add(Values.literal(canon));
        }
        return out;
    }

    /** {@link #canonical}, sorted: the rows as a multiset. */
    static List<String> bag(List<List<Object>> rows) {
        List<String> out = canonical(rows);
        Collections.sort(out);
        return out;
    }

    private static List<String> sortedLiterals(List<?> l) {
        List<String> out = new ArrayList<>();
        for (Object o : l) out.add(Values.literal(o));
        Collections.sort(out);
        return out;
    }
}
