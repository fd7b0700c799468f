package dev.termgate.engine;

import dev.termgate.query.Expr;
import dev.termgate.query.Node;
import dev.termgate.query.Trees;

import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/** The standard aggregating functions, computed per group on the client. */
final class Aggregation {
    private static final Set<String> NAMES = Set.of("count", "sum", "avg", "min", "max", "collect", "stdev", "stdevp",
            "percentilecont", "percentiledisc");

    private Aggregation() {}

    static boolean isAggregate(Expr e) {
        return e instanceof Expr.CountStar
                || e instanceof Expr.FunctionCall f && f.namespace().isEmpty() && NAMES.contains(f.name().toLowerCase(Locale.ROOT));
    }

    /** Aggregate calls inside an expression, outermost only, skipping nested scopes that cannot hold them. */
    static List<Expr> calls(Expr e) {
        List<Expr> out = new ArrayList<>();
        collect(e, out);
        return out;
    }

    private static void collect(Node n, List<Expr> out) {
        if (n instanceof Expr e && isAggregate(e)) {
            out.add(e);
            return;
        }
        if (n instanceof Expr.ExistsSubquery || n instanceof Expr.CountSubquery) return;
        for (Node c : Trees.children(n)) collect(c, out);
    }

    static boolean contains(Expr e) {
        return !calls(e).isEmpty();
    }

    /** One running aggregate of one group. */
    static final class Acc {
        private final String fn;
        private final boolean distinct;
        private final List<Object> values = new ArrayList<>();
        private final Set<Object> seen = new HashSet<>();
        private long countStar;
        private Object param;

        Acc(Expr call) {
            if (call instanceof Expr.CountStar) {
                fn = "count*";
                distinct = false;
            } else {
                Expr.FunctionCall f = (Expr.FunctionCall) call;
                fn = f.name().toLowerCase(Locale.ROOT);
                distinct = f.distinct();
            }
        }

        boolean isCountStar() {
            return fn.equals("count*");
        }

        void addStar() {
            countStar++;
        }

        void add(Object v, Object percentile) {
            if (percentile != null) param = percentile;
            if (v == null) return;
            if (distinct && !seen.add(Values.groupKey(v))) return;
            values.add(v);
        }

        Object result() {
            return switch (fn) {
                case "count*" -> countStar;
                case "count" -> (long) values.size();
                case "collect" -> Collections.unmodifiableList(new ArrayList<>(values));
                case "sum" -> sum();
                case "avg" -> {
                    if (values.isEmpty()) yield null;
                    yield floatSum() / values.size();
                }
                case "min" -> values.stream().min(Values::orderCompare).orElse(null);
                case "max" -> values.stream().max(Aggregation::maxCompare).orElse(null);
                case "stdev", "stdevp" -> stdev(fn.equals("stdevp"));
                case "percentilecont", "percentiledisc" -> percentile(fn.equals("percentiledisc"));
                default -> throw new IllegalStateException(fn);
            };
        }

        private Object sum() {
            boolean floating = values.stream().anyMatch(v -> number(v) instanceof Double);
            if (floating) return floatSum();
            long total = 0;
            for (Object v : values) {
                try { total = Math.addExact(total, number(v).longValue()); }
                catch (ArithmeticException e) { throw EngineException.runtime("integer overflow in sum()"); }
            }
            return total;
        }

        /**
         * The sum rounded once, from the exact sum: the same whatever order the rows came in (an index, a remote
         * server or a scan may deliver them differently, and adding floats left to right depends on the order).
         */
        private double floatSum() {
            java.math.BigDecimal exact = java.math.BigDecimal.ZERO;
            double plain = 0;
            boolean finite = true;
            for (Object v : values) {
                Number n = number(v);
                double d = n.doubleValue();
                plain += d;
                if (!Double.isFinite(d)) finite = false;
                else exact = exact.add(n instanceof Double ? new java.math.BigDecimal(d) : java.math.BigDecimal.valueOf(n.longValue()));
            }
            return finite ? exact.doubleValue() : plain;
        }

        private Object stdev(boolean population) {
            int n = values.size();
            if (n == 0 || (!population && n == 1)) return 0.0;
            double mean = 0;
            for (Object v : values) mean += number(v).doubleValue();
            mean /= n;
            double sq = 0;
            for (Object v : values) {
                double d = number(v).doubleValue() - mean;
                sq += d * d;
            }
            return Math.sqrt(sq / (population ? n : n - 1));
        }

        private Object percentile(boolean discrete) {
            if (values.isEmpty()) return null;
            if (!(param instanceof Number pn)) throw EngineException.runtime("percentile must be a number");
            double p = pn.doubleValue();
            if (p < 0 || p > 1) throw EngineException.runtime("percentile must be between 0.0 and 1.0");
            List<Object> sorted = new ArrayList<>(values);
            sorted.sort(Values::orderCompare);
            int n = sorted.size();
            if (discrete) {
                int idx = p == 0 ? 0 : (int) Math.ceil(p * n) - 1;
                return sorted.get(Math.max(0, Math.min(n - 1, idx)));
            }
            double pos = p * (n - 1);
            int lo = (int) Math.floor(pos), hi = (int) Math.ceil(pos);
            double a = number(sorted.get(lo)).doubleValue(), b = number(sorted.get(hi)).doubleValue();
            return a + (b - a) * (pos - lo);
        }

        private static Number number(Object v) {
            if (v instanceof Number n) return n;
            throw EngineException.runtime("cannot aggregate a " + Values.typeName(v) + " numerically");
        }
    }

    /** max() uses the same order as ORDER BY but must not let null win (nulls are skipped before). */
    private static int maxCompare(Object a, Object b) {
        return Values.orderCompare(a, b);
    }
}
