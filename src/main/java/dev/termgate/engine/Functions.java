package dev.termgate.engine;

import dev.termgate.query.Expr;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.UUID;

/** The openCypher standard scalar functions (openCypher 9, "Functions"). Names arrive lower-cased. */
final class Functions {
    private final Evaluator.Host host;

    /** The statement's clock, read once per query (an Evaluator, and so this, serves one query). */
    private java.time.ZonedDateTime statementNow;

    private synchronized java.time.ZonedDateTime statementNow() {
        if (statementNow == null) statementNow = java.time.ZonedDateTime.now(java.time.ZoneOffset.UTC);
        return statementNow;
    }

    Functions(Evaluator.Host host) {
        this.host = host;
    }

    Object call(String name, List<Object> a, Expr.FunctionCall call) {
        return switch (name) {
            // ---- graph elements ----
            case "id" -> nullOr(a, 0, v -> {
                if (v instanceof NodeValue n) return Values.normalize(n.id());
                if (v instanceof RelValue r) return Values.normalize(r.id());
                throw type(name, v);
            });
            case "elementid" -> nullOr(a, 0, v -> {
                if (v instanceof NodeValue n) return String.valueOf(n.id());
                if (v instanceof RelValue r) return String.valueOf(r.id());
                throw type(name, v);
            });
            case "labels" -> nullOr(a, 0, v -> {
                if (v instanceof NodeValue n) return new ArrayList<Object>(n.labels());
                throw type(name, v);
            });
            case "type" -> nullOr(a, 0, v -> {
                if (v instanceof RelValue r) return r.type();
                throw type(name, v);
            });
            case "properties" -> nullOr(a, 0, v -> {
                if (v instanceof NodeValue n) return n.properties();
                if (v instanceof RelValue r) return r.properties();
                if (v instanceof Map<?, ?> m) return m;
                throw type(name, v);
            });
            case "keys" -> nullOr(a, 0, v -> {
                if (v instanceof NodeValue n) return new ArrayList<Object>(n.properties().keySet());
                if (v instanceof RelValue r) return new ArrayList<Object>(r.properties().keySet());
                if (v instanceof Map<?, ?> m) return new ArrayList<Object>(m.keySet());
                throw type(name, v);
            });
            case "startnode" -> nullOr(a, 0, v -> {
                if (v instanceof RelValue r) return host.nodeById(r.start());
                throw type(name, v);
            });
            case "endnode" -> nullOr(a, 0, v -> {
                if (v instanceof RelValue r) return host.nodeById(r.end());
                throw type(name, v);
            });
            case "nodes" -> nullOr(a, 0, v -> {
                if (v instanceof PathValue p) return new ArrayList<Object>(p.nodes());
                throw type(name, v);
            });
            case "relationships" -> nullOr(a, 0, v -> {
                if (v instanceof PathValue p) return new ArrayList<Object>(p.rels());
                throw type(name, v);
            });
            case "length" -> nullOr(a, 0, v -> {
                if (v instanceof PathValue p) return (long) p.rels().size();
                if (v instanceof String s) return (long) s.codePointCount(0, s.length());
                if (v instanceof List<?> l) return (long) l.size();
                throw type(name, v);
            });
            case "size" -> nullOr(a, 0, v -> {
                if (v instanceof String s) return (long) s.codePointCount(0, s.length());
                if (v instanceof List<?> l) return (long) l.size();
                if (v instanceof Map<?, ?> m) return (long) m.size();
                throw type(name, v);
            });
            case "exists" -> a.get(0) != null;
            case "isempty" -> nullOr(a, 0, v -> {
                if (v instanceof String s) return s.isEmpty();
                if (v instanceof List<?> l) return l.isEmpty();
                if (v instanceof Map<?, ?> m) return m.isEmpty();
                throw type(name, v);
            });
            // ---- lists ----
            case "head" -> nullOr(a, 0, v -> { List<?> l = list(name, v); return l.isEmpty() ? null : l.get(0); });
            case "last" -> nullOr(a, 0, v -> { List<?> l = list(name, v); return l.isEmpty() ? null : l.get(l.size() - 1); });
            case "tail" -> nullOr(a, 0, v -> { List<?> l = list(name, v); return l.isEmpty() ? List.of() : new ArrayList<Object>(l.subList(1, l.size())); });
            case "reverse" -> nullOr(a, 0, v -> {
                if (v instanceof String s) return new StringBuilder(s).reverse().toString();
                List<Object> c = new ArrayList<>(list(name, v));
                Collections.reverse(c);
                return c;
            });
            case "range" -> range(a);
            case "coalesce" -> { for (Object v : a) if (v != null) yield v; yield null; }
            // ---- conversion ----
            case "tostring" -> nullOr(a, 0, v -> {
                if (v instanceof String s) return s;
                if (v instanceof Long l) return l.toString();
                if (v instanceof Double d) return Values.formatFloat(d);
                if (v instanceof Boolean b) return b.toString();
                if (Temporals.isTemporal(v)) return Temporals.text(v);
                throw type(name, v);
            });
            case "tostringornull" -> a.get(0) instanceof String || Values.isNumber(a.get(0)) || a.get(0) instanceof Boolean || Temporals.isTemporal(a.get(0))
                    ? call("tostring", a, call) : null;
            case "tointeger" -> nullOr(a, 0, v -> toInteger(v, true));
            case "tointegerornull" -> a.get(0) == null ? null : toInteger(a.get(0), false);
            case "tofloat" -> nullOr(a, 0, v -> toFloat(v, true));
            case "tofloatornull" -> a.get(0) == null ? null : toFloat(a.get(0), false);
            case "toboolean" -> nullOr(a, 0, v -> toBoolean(v, true));
            case "tobooleanornull" -> a.get(0) == null ? null : toBoolean(a.get(0), false);
            // ---- numbers ----
            case "abs" -> nullOr(a, 0, v -> v instanceof Long l ? (Object) Math.abs(l) : (Object) Math.abs(num(name, v)));
            case "ceil" -> nullOr(a, 0, v -> Math.ceil(num(name, v)));
            case "floor" -> nullOr(a, 0, v -> Math.floor(num(name, v)));
            case "round" -> nullOr(a, 0, v -> round(num(name, v)));
            case "sign" -> nullOr(a, 0, v -> (long) Math.signum(num(name, v)));
            case "sqrt" -> nullOr(a, 0, v -> Math.sqrt(num(name, v)));
            case "exp" -> nullOr(a, 0, v -> Math.exp(num(name, v)));
            case "log" -> nullOr(a, 0, v -> Math.log(num(name, v)));
            case "log10" -> nullOr(a, 0, v -> Math.log10(num(name, v)));
            case "sin" -> nullOr(a, 0, v -> Math.sin(num(name, v)));
            case "cos" -> nullOr(a, 0, v -> Math.cos(num(name, v)));
            case "tan" -> nullOr(a, 0, v -> Math.tan(num(name, v)));
            case "cot" -> nullOr(a, 0, v -> 1.0 / Math.tan(num(name, v)));
            case "asin" -> nullOr(a, 0, v -> Math.asin(num(name, v)));
            case "acos" -> nullOr(a, 0, v -> Math.acos(num(name, v)));
            case "atan" -> nullOr(a, 0, v -> Math.atan(num(name, v)));
            case "atan2" -> a.get(0) == null || a.get(1) == null ? null : Math.atan2(num(name, a.get(0)), num(name, a.get(1)));
            case "degrees" -> nullOr(a, 0, v -> Math.toDegrees(num(name, v)));
            case "radians" -> nullOr(a, 0, v -> Math.toRadians(num(name, v)));
            case "haversin" -> nullOr(a, 0, v -> (1 - Math.cos(num(name, v))) / 2);
            case "isnan" -> nullOr(a, 0, v -> v instanceof Double d && d.isNaN());
            case "e" -> Math.E;
            case "pi" -> Math.PI;
            case "rand" -> Math.random();
            case "timestamp" -> System.currentTimeMillis();
            case "randomuuid" -> UUID.randomUUID().toString();
            // ---- strings ----
            case "toupper", "upper" -> nullOr(a, 0, v -> str(name, v).toUpperCase(Locale.ROOT));
            case "tolower", "lower" -> nullOr(a, 0, v -> str(name, v).toLowerCase(Locale.ROOT));
            case "trim" -> nullOr(a, 0, v -> str(name, v).strip());
            case "ltrim" -> nullOr(a, 0, v -> str(name, v).stripLeading());
            case "rtrim" -> nullOr(a, 0, v -> str(name, v).stripTrailing());
            case "left" -> a.get(0) == null ? null : left(str(name, a.get(0)), count(name, a.get(1)));
            case "right" -> a.get(0) == null ? null : right(str(name, a.get(0)), count(name, a.get(1)));
            case "substring" -> substring(name, a);
            case "replace" -> a.contains(null) ? null : str(name, a.get(0)).replace(str(name, a.get(1)), str(name, a.get(2)));
            case "split" -> a.contains(null) ? null : split(str(name, a.get(0)), str(name, a.get(1)));
            case "char_length", "character_length" -> nullOr(a, 0, v -> (long) str(name, v).codePointCount(0, str(name, v).length()));
            default -> {
                if (isTemporal(name)) yield Temporals.construct(name, a, this::statementNow);
                throw EngineException.runtime("unknown function '" + call.qualifiedName() + "'");
            }
        };
    }

    private static boolean isTemporal(String name) {
        String base = name.contains(".") ? name.substring(0, name.indexOf('.')) : name;
        return switch (base) {
            case "date", "datetime", "localdatetime", "time", "localtime", "duration" -> true;
            default -> false;
        };
    }

    private interface Fn { Object apply(Object v); }

    private static Object nullOr(List<Object> a, int i, Fn fn) {
        if (a.size() <= i) throw EngineException.runtime("missing argument");
        Object v = a.get(i);
        return v == null ? null : fn.apply(v);
    }

    private static EngineException type(String fn, Object v) {
        return EngineException.runtime("function " + fn + "() cannot take a " + Values.typeName(v));
    }

    private static List<?> list(String fn, Object v) {
        if (v instanceof List<?> l) return l;
        throw type(fn, v);
    }

    private static double num(String fn, Object v) {
        if (v instanceof Number n) return n.doubleValue();
        throw type(fn, v);
    }

    private static String str(String fn, Object v) {
        if (v instanceof String s) return s;
        throw type(fn, v);
    }

    private static int count(String fn, Object v) {
        if (v == null) throw EngineException.runtime(fn + "() length must not be null");
        if (!(v instanceof Long l)) throw type(fn, v);
        if (l < 0) throw EngineException.runtime(fn + "() length must not be negative");
        return (int) Math.min(l, Integer.MAX_VALUE);
    }

    private static Object round(double d) {
        if (Double.isNaN(d) || Double.isInfinite(d)) return d;
        return (double) Math.round(d);
    }

    private static Object range(List<Object> a) {
        for (Object o : a) {
            if (o == null) throw EngineException.runtime("range() arguments must not be null");
            if (!(o instanceof Long)) throw type("range", o);
        }
        long from = (Long) a.get(0), to = (Long) a.get(1), step = a.size() > 2 ? (Long) a.get(2) : 1;
        if (step == 0) throw EngineException.runtime("range() step must not be zero");
        List<Object> out = new ArrayList<>();
        if (step > 0) for (long i = from; i <= to; i += step) { out.add(i); checkSize(out); }
        else for (long i = from; i >= to; i += step) { out.add(i); checkSize(out); }
        return out;
    }

    private static void checkSize(List<Object> out) {
        if (out.size() > 10_000_000) throw EngineException.runtime("range() would hold more than 10,000,000 items");
    }

    private static Object toInteger(Object v, boolean strict) {
        if (v instanceof Long l) return l;
        if (v instanceof Double d) {
            if (d.isNaN() || d.isInfinite()) return strict ? fail("toInteger", v) : null;
            return d.longValue();
        }
        if (v instanceof Boolean b) return b ? 1L : 0L;
        if (v instanceof String s) {
            String t = s.strip();
            try {
                return Long.parseLong(t);
            } catch (NumberFormatException e) {
                try {
                    double d = Double.parseDouble(t);
                    return Double.isNaN(d) || Double.isInfinite(d) ? null : (Object) (long) d;
                } catch (NumberFormatException e2) {
                    return null;
                }
            }
        }
        return strict ? fail("toInteger", v) : null;
    }

    private static Object toFloat(Object v, boolean strict) {
        if (v instanceof Long l) return l.doubleValue();
        if (v instanceof Double d) return d;
        if (v instanceof String s) {
            try {
                return Double.parseDouble(s.strip());
            } catch (NumberFormatException e) {
                return null;
            }
        }
        return strict ? fail("toFloat", v) : null;
    }

    private static Object toBoolean(Object v, boolean strict) {
        if (v instanceof Boolean b) return b;
        if (v instanceof String s) {
            String t = s.strip().toLowerCase(Locale.ROOT);
            return t.equals("true") ? Boolean.TRUE : t.equals("false") ? Boolean.FALSE : null;
        }
        if (v instanceof Long l) return l != 0;
        return strict ? fail("toBoolean", v) : null;
    }

    private static Object fail(String fn, Object v) {
        throw type(fn, v);
    }

    private static String left(String s, int n) {
        return s.substring(0, Math.min(n, s.length()));
    }

    private static String right(String s, int n) {
        return s.substring(Math.max(0, s.length() - n));
    }

    private static Object substring(String name, List<Object> a) {
        if (a.get(0) == null) return null;
        String s = str(name, a.get(0));
        if (!(a.get(1) instanceof Long start)) throw EngineException.runtime("substring() start must be an integer");
        if (start < 0) throw EngineException.runtime("substring() start must not be negative");
        int from = (int) Math.min(start, s.length());
        if (a.size() < 3) return s.substring(from);
        int len = count(name, a.get(2));
        return s.substring(from, (int) Math.min((long) from + len, s.length()));
    }

    private static Object split(String s, String sep) {
        List<Object> out = new ArrayList<>();
        if (sep.isEmpty()) {
            s.codePoints().forEach(cp -> out.add(new String(Character.toChars(cp))));
            return out;
        }
        int i = 0;
        while (true) {
            int j = s.indexOf(sep, i);
            if (j < 0) { out.add(s.substring(i)); break; }
            out.add(s.substring(i, j));
            i = j + sep.length();
        }
        return out;
    }

    static Map<String, Object> copy(Map<String, Object> m) {
        return new LinkedHashMap<>(m);
    }
}
