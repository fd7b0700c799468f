package dev.termgate.engine;

import java.util.ArrayList;
import java.util.Collections;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;

/**
 * The openCypher value model on plain Java objects: {@code null}, Boolean, Long, Double, String,
 * List, Map (String keys, insertion order), {@link NodeValue}, {@link RelValue}, {@link PathValue}.
 * Equality here is ternary (null when unknown); ordering for ORDER BY is total (openCypher 9, "Comparability
 * and equality" and "Ordering" sections).
 */
public final class Values {
    private Values() {}

    /** Converts what a graph store hands back (Integer, Float, arrays…) into the value model. */
    public static Object normalize(Object v) {
        if (v == null || v instanceof String || v instanceof Boolean || v instanceof Long || v instanceof Double) return v;
        if (v instanceof Integer || v instanceof Short || v instanceof Byte) return ((Number) v).longValue();
        if (v instanceof Float f) return f.doubleValue();
        if (v instanceof java.math.BigInteger b) return b.longValue();
        if (v instanceof java.math.BigDecimal b) return b.doubleValue();
        if (v instanceof Character c) return c.toString();
        if (v instanceof List<?> l) {
            List<Object> out = new ArrayList<>(l.size());
            for (Object o : l) out.add(normalize(o));
            return Collections.unmodifiableList(out);
        }
        if (v instanceof Set<?> s) return normalize(new ArrayList<>(s));
        if (v instanceof Object[] a) return normalize(java.util.Arrays.asList(a));
        if (v instanceof long[] a) { List<Object> o = new ArrayList<>(); for (long x : a) o.add(x); return Collections.unmodifiableList(o); }
        if (v instanceof int[] a) { List<Object> o = new ArrayList<>(); for (int x : a) o.add((long) x); return Collections.unmodifiableList(o); }
        if (v instanceof double[] a) { List<Object> o = new ArrayList<>(); for (double x : a) o.add(x); return Collections.unmodifiableList(o); }
        if (v instanceof Map<?, ?> m) {
            Map<String, Object> out = new LinkedHashMap<>();
            m.forEach((k, x) -> out.put(String.valueOf(k), normalize(x)));
            return Collections.unmodifiableMap(out);
        }
        if (v instanceof NodeValue || v instanceof RelValue || v instanceof PathValue) return v;
        Object t = Temporals.normalize(v);
        if (Temporals.isTemporal(t)) return t;
        return v.toString();
    }

    static Map<String, Object> unmodifiableMap(Map<String, Object> m) {
        return Collections.unmodifiableMap(new LinkedHashMap<>(m));
    }

    /** Ids compare by value whatever numeric class a store used for them. */
    static Object idKey(Object id) {
        return id instanceof Number n && !(id instanceof Double || id instanceof Float) ? (Object) n.longValue() : id;
    }

    public static String typeName(Object v) {
        if (v == null) return "NULL";
        if (v instanceof Boolean) return "BOOLEAN";
        if (v instanceof Long) return "INTEGER";
        if (v instanceof Double) return "FLOAT";
        if (v instanceof String) return "STRING";
        if (v instanceof List) return "LIST";
        if (v instanceof Map) return "MAP";
        if (v instanceof NodeValue) return "NODE";
        if (v instanceof RelValue) return "RELATIONSHIP";
        if (v instanceof PathValue) return "PATH";
        if (Temporals.isTemporal(v)) return Temporals.typeName(v);
        return v.getClass().getSimpleName();
    }

    static boolean isNumber(Object v) {
        return v instanceof Long || v instanceof Double;
    }

    /** Ternary equality: TRUE, FALSE, or null when null takes part in a way that leaves it unknown. */
    public static Boolean eq(Object a, Object b) {
        if (a == null || b == null) return null;
        if (isNumber(a) && isNumber(b)) return numEq((Number) a, (Number) b);
        if (a instanceof List<?> la && b instanceof List<?> lb) {
            if (la.size() != lb.size()) return false;
            boolean unknown = false;
            for (int i = 0; i < la.size(); i++) {
                Boolean e = eq(la.get(i), lb.get(i));
                if (e == null) unknown = true;
                else if (!e) return false;
            }
            return unknown ? null : true;
        }
        if (a instanceof Map<?, ?> ma && b instanceof Map<?, ?> mb) {
            if (!ma.keySet().equals(mb.keySet())) return false;
            boolean unknown = false;
            for (Object k : ma.keySet()) {
                Boolean e = eq(ma.get(k), mb.get(k));
                if (e == null) unknown = true;
                else if (!e) return false;
            }
            return unknown ? null : true;
        }
        if (a instanceof PathValue pa && b instanceof PathValue pb) {
            return pa.nodes().equals(pb.nodes()) && pa.rels().equals(pb.rels());
        }
        if (!typeName(a).equals(typeName(b))) return false;
        if (Temporals.isTemporal(a)) return Temporals.equal(a, b);
        return a.equals(b);
    }

    private static boolean numEq(Number a, Number b) {
        if (a instanceof Long x && b instanceof Long y) return x.longValue() == y.longValue();
        if (a instanceof Long x) return exactEq(x, b.doubleValue());
        if (b instanceof Long y) return exactEq(y, a.doubleValue());
        return a.doubleValue() == b.doubleValue();
    }

    private static boolean exactEq(long l, double d) {
        return !Double.isNaN(d) && (double) l == d && (d < 9.2e18 && d > -9.2e18 ? (long) d == l : true);
    }

    /**
     * Ternary comparison for {@code < <= > >=}: null when the values are not comparable (different types,
     * null, NaN involved).
     */
    public static Integer compare(Object a, Object b) {
        if (a == null || b == null) return null;
        if (isNumber(a) && isNumber(b)) {
            if (a instanceof Double d && d.isNaN() || b instanceof Double e && e.isNaN()) return null;
            return numCompare((Number) a, (Number) b);
        }
        if (a instanceof String x && b instanceof String y) return Integer.signum(x.compareTo(y));
        if (a instanceof Boolean x && b instanceof Boolean y) return Boolean.compare(x, y);
        if (Temporals.isTemporal(a) && Temporals.isTemporal(b)) return Temporals.compare(a, b);
        if (a instanceof List<?> la && b instanceof List<?> lb) {
            int n = Math.min(la.size(), lb.size());
            for (int i = 0; i < n; i++) {
                Integer c = compare(la.get(i), lb.get(i));
                if (c == null) return null;
                if (c != 0) return c;
            }
            return Integer.compare(la.size(), lb.size());
        }
        return null;
    }

    static int numCompare(Number a, Number b) {
        if (a instanceof Long x && b instanceof Long y) return Long.compare(x, y);
        if (a instanceof Long x) return -cmpDoubleLong(b.doubleValue(), x);
        if (b instanceof Long y) return cmpDoubleLong(a.doubleValue(), y);
        return Double.compare(a.doubleValue(), b.doubleValue()) ;
    }

    private static int cmpDoubleLong(double d, long l) {
        if (Double.isNaN(d)) return 1;
        if (d < -9.3e18) return -1;
        if (d > 9.3e18) return 1;
        double c = d - (double) l;
        if (c != 0) return c < 0 ? -1 : 1;
        // equal as doubles: compare exactly via the long part
        long dl = (long) d;
        if (dl != l) return Long.compare(dl, l);
        double frac = d - dl;
        return frac == 0 ? 0 : (frac < 0 ? -1 : 1);
    }

    /** Rank of each type in the total order used by ORDER BY (openCypher 9 "Ordering"). */
    private static int orderRank(Object v) {
        if (v instanceof Map) return 0;
        if (v instanceof NodeValue) return 1;
        if (v instanceof RelValue) return 2;
        if (v instanceof List) return 3;
        if (v instanceof PathValue) return 4;
        if (Temporals.isTemporal(v)) return 10 + Temporals.orderRank(v);
        if (v instanceof String) return 20;
        if (v instanceof Boolean) return 21;
        if (isNumber(v)) return 22;
        if (v == null) return 99;
        return 30;
    }

    /** Total order for ORDER BY, min/max and sorting lists; null sorts last. */
    public static int orderCompare(Object a, Object b) {
        int ra = orderRank(a), rb = orderRank(b);
        if (ra != rb) return Integer.compare(ra, rb);
        return switch (ra) {
            case 0 -> compareMaps((Map<?, ?>) a, (Map<?, ?>) b);
            case 1 -> compareIds(((NodeValue) a).id(), ((NodeValue) b).id());
            case 2 -> compareIds(((RelValue) a).id(), ((RelValue) b).id());
            case 3 -> compareLists((List<?>) a, (List<?>) b);
            case 4 -> comparePaths((PathValue) a, (PathValue) b);
            case 10, 11, 12, 13, 14, 15 -> Temporals.order(a, b);
            case 20 -> ((String) a).compareTo((String) b);
            case 21 -> Boolean.compare((Boolean) a, (Boolean) b);
            case 22 -> {
                boolean na = a instanceof Double d && d.isNaN(), nb = b instanceof Double d2 && d2.isNaN();
                if (na || nb) yield Boolean.compare(na, nb);
                yield numCompare((Number) a, (Number) b);
            }
            case 99 -> 0;
            default -> a.toString().compareTo(b.toString());
        };
    }

    private static int compareIds(Object a, Object b) {
        Object x = idKey(a), y = idKey(b);
        if (x instanceof Long l && y instanceof Long m) return Long.compare(l, m);
        return String.valueOf(x).compareTo(String.valueOf(y));
    }

    private static int compareLists(List<?> a, List<?> b) {
        int n = Math.min(a.size(), b.size());
        for (int i = 0; i < n; i++) {
            int c = orderCompare(a.get(i), b.get(i));
            if (c != 0) return c;
        }
        return Integer.compare(a.size(), b.size());
    }

    private static int compareMaps(Map<?, ?> a, Map<?, ?> b) {
        List<String> ka = new ArrayList<>(new TreeSet<>(stringKeys(a)));
        List<String> kb = new ArrayList<>(new TreeSet<>(stringKeys(b)));
        int c = compareLists(ka, kb);
        if (c != 0) return c;
        for (String k : ka) {
            c = orderCompare(a.get(k), b.get(k));
            if (c != 0) return c;
        }
        return 0;
    }

    private static List<String> stringKeys(Map<?, ?> m) {
        List<String> out = new ArrayList<>();
        for (Object k : m.keySet()) out.add(String.valueOf(k));
        return out;
    }

    private static int comparePaths(PathValue a, PathValue b) {
        int c = compareLists(a.nodes(), b.nodes());
        return c != 0 ? c : compareLists(a.rels(), b.rels());
    }

    /**
     * A key with Java equality matching openCypher equivalence (DISTINCT, grouping): null ≡ null, 1 ≡ 1.0,
     * lists and maps element-wise.
     */
    public static Object groupKey(Object v) {
        if (v instanceof Double d) {
            if (!d.isNaN() && !d.isInfinite() && d == Math.rint(d) && Math.abs(d) < 9.0e15) return d.longValue();
            return d;
        }
        if (v instanceof List<?> l) {
            List<Object> out = new ArrayList<>(l.size());
            for (Object o : l) out.add(groupKey(o));
            return out;
        }
        if (v instanceof Map<?, ?> m) {
            Map<Object, Object> out = new java.util.HashMap<>();
            m.forEach((k, x) -> out.put(k, groupKey(x)));
            return out;
        }
        if (v instanceof PathValue p) return List.of("path", p.nodes(), p.rels());
        if (v instanceof java.time.ZonedDateTime z) return List.of("datetime", z.toInstant(), z.getZone().getId());
        if (v instanceof java.time.OffsetTime t) return List.of("time", t.withOffsetSameInstant(java.time.ZoneOffset.UTC).toLocalTime());
        return v;
    }

    /** Truthiness for WHERE: only TRUE keeps a row. */
    static boolean isTrue(Object v) {
        return Boolean.TRUE.equals(v);
    }

    /** Text for terminals and CSV; strings inside collections are quoted, top-level strings are not. */
    public static String display(Object v) {
        if (v instanceof String s) return s;
        if (Temporals.isTemporal(v)) return Temporals.text(v);
        return literal(v);
    }

    /** A literal-like rendering close to the openCypher TCK notation. */
    public static String literal(Object v) {
        StringBuilder sb = new StringBuilder();
        appendLiteral(sb, v);
        return sb.toString();
    }

    private static void appendLiteral(StringBuilder sb, Object v) {
        if (v == null) sb.append("null");
        else if (v instanceof String s) sb.append('\'').append(s.replace("\\", "\\\\").replace("'", "\\'")).append('\'');
        else if (v instanceof Double d) sb.append(formatFloat(d));
        else if (v instanceof List<?> l) {
            sb.append('[');
            for (Iterator<?> it = l.iterator(); it.hasNext(); ) {
                appendLiteral(sb, it.next());
                if (it.hasNext()) sb.append(", ");
            }
            sb.append(']');
        } else if (v instanceof Map<?, ?> m) {
            sb.append('{');
            appendProps(sb, m);
            sb.append('}');
        } else if (v instanceof NodeValue n) {
            sb.append('(');
            n.labels().forEach(l -> sb.append(':').append(l));
            if (!n.properties().isEmpty()) {
                if (!n.labels().isEmpty()) sb.append(' ');
                sb.append('{');
                appendProps(sb, n.properties());
                sb.append('}');
            }
            sb.append(')');
        } else if (v instanceof RelValue r) {
            sb.append("[:").append(r.type());
            if (!r.properties().isEmpty()) {
                sb.append(" {");
                appendProps(sb, r.properties());
                sb.append('}');
            }
            sb.append(']');
        } else if (v instanceof PathValue p) {
            sb.append('<');
            appendLiteral(sb, p.nodes().get(0));
            for (int i = 0; i < p.rels().size(); i++) {
                RelValue r = p.rels().get(i);
                NodeValue next = p.nodes().get(i + 1);
                boolean forward = idKey(r.end()).equals(idKey(next.id()));
                sb.append(forward ? "-" : "<-");
                appendLiteral(sb, r);
                sb.append(forward ? "->" : "-");
                appendLiteral(sb, next);
            }
            sb.append('>');
        } else if (Temporals.isTemporal(v)) {
            appendLiteral(sb, Temporals.text(v));
        } else sb.append(v);
    }

    private static void appendProps(StringBuilder sb, Map<?, ?> m) {
        boolean first = true;
        for (Map.Entry<?, ?> e : m.entrySet()) {
            if (!first) sb.append(", ");
            first = false;
            sb.append(e.getKey()).append(": ");
            appendLiteral(sb, e.getValue());
        }
    }

    static String formatFloat(double d) {
        if (Double.isNaN(d)) return "NaN";
        if (Double.isInfinite(d)) return d > 0 ? "Infinity" : "-Infinity";
        String s = Double.toString(d);
        return s;
    }
}
