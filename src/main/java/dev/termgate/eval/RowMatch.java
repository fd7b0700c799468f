package dev.termgate.eval;

import java.math.BigDecimal;
import java.math.MathContext;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * Compares a candidate's rows with the gold rows. Rows are compared as bags (multisets); in order only when the
 * gold query orders its result, and then only as far as the order is determined: rows that tie on the gold's
 * sort keys may come in any order. Column names and column order do not matter (any assignment of the
 * candidate's columns to the gold's that makes the results equal will do), since a question does not fix them.
 * Numbers compare by value to 12 significant digits, so 42 equals 42.0 and sums added in another order agree.
 */
public final class RowMatch {

    private RowMatch() {}

    /**
     * @param goldSortColumns the gold's sort keys as column indexes, in order; empty when the gold does not
     *                        order; a {@code -1} entry means a key that is not a column (then the whole order
     *                        must agree)
     */
    public static boolean same(List<List<Object>> gold, List<List<Object>> candidate, List<Integer> goldSortColumns) {
        if (gold.size() != candidate.size()) return false;
        int width = gold.isEmpty() ? -1 : gold.get(0).size();
        if (!gold.isEmpty() && candidate.get(0).size() != width) return false;
        if (gold.isEmpty()) return true;
        for (int[] perm : permutations(width)) {
            List<List<String>> c = new ArrayList<>();
            for (List<Object> row : candidate) {
                List<String> r = new ArrayList<>(width);
                for (int k = 0; k < width; k++) r.add(key(row.get(perm[k])));
                c.add(r);
            }
            List<List<String>> g = gold.stream().map(r -> r.stream().map(RowMatch::key).toList()).toList();
            if (!sameBag(g, c)) continue;
            if (goldSortColumns.isEmpty()) return true;
            if (goldSortColumns.contains(-1)) {
                if (g.equals(c)) return true;
                continue;
            }
            boolean ordered = true;
            for (int i = 0; i < g.size() && ordered; i++) {
                for (int col : goldSortColumns) {
                    if (!g.get(i).get(col).equals(c.get(i).get(col))) {
                        ordered = false;
                        break;
                    }
                }
            }
            if (ordered) return true;
        }
        return false;
    }

    private static boolean sameBag(List<List<String>> a, List<List<String>> b) {
        Map<List<String>, Integer> count = new HashMap<>();
        for (List<String> r : a) count.merge(r, 1, Integer::sum);
        for (List<String> r : b) {
            Integer n = count.get(r);
            if (n == null || n == 0) return false;
            count.put(r, n - 1);
        }
        return true;
    }

    /** A canonical text of a value: numbers by value, lists and maps element by element. */
    static String key(Object v) {
        if (v == null) return "null";
        if (v instanceof Number n) {
            double d = n.doubleValue();
            if (Double.isNaN(d) || Double.isInfinite(d)) return "n:" + d;
            return "n:" + new BigDecimal(d).round(new MathContext(12)).stripTrailingZeros().toPlainString();
        }
        if (v instanceof List<?> l) {
            List<String> parts = new ArrayList<>();
            for (Object o : l) parts.add(key(o));
            return "l:" + parts;
        }
        if (v instanceof Map<?, ?> m) {
            Map<String, String> sorted = new java.util.TreeMap<>();
            m.forEach((k, x) -> sorted.put(String.valueOf(k), key(x)));
            return "m:" + sorted;
        }
        if (v instanceof Boolean b) return "b:" + b;
        if (v instanceof Optional<?> o) return key(o.orElse(null));
        return "s:" + v;
    }

    /** Every ordering of {@code 0..n-1}; identity first. Results of more than 6 columns are compared as written. */
    private static List<int[]> permutations(int n) {
        List<int[]> out = new ArrayList<>();
        int[] a = new int[n];
        for (int i = 0; i < n; i++) a[i] = i;
        if (n > 6) {
            out.add(a);
            return out;
        }
        permute(a, 0, out);
        return out;
    }

    private static void permute(int[] a, int k, List<int[]> out) {
        if (k == a.length) {
            out.add(a.clone());
            return;
        }
        for (int i = k; i < a.length; i++) {
            int t = a[k]; a[k] = a[i]; a[i] = t;
            permute(a, k + 1, out);
            t = a[k]; a[k] = a[i]; a[i] = t;
        }
    }
}
