package dev.termgate.engine;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/** openCypher arithmetic: integers stay integers (overflow is an error), any float makes a float. */
final class Arith {
    private Arith() {}

    static Object add(Object l, Object r) {
        if (l == null || r == null) return null;
        if (l instanceof List<?> a) {
            List<Object> out = new ArrayList<>(a);
            if (r instanceof List<?> b) out.addAll(b); else out.add(r);
            return Collections.unmodifiableList(out);
        }
        if (r instanceof List<?> b) {
            List<Object> out = new ArrayList<>();
            out.add(l);
            out.addAll(b);
            return Collections.unmodifiableList(out);
        }
        if (l instanceof DurationValue a && r instanceof DurationValue b) return a.plus(b);
        if (r instanceof DurationValue d && Temporals.isTemporal(l)) return Temporals.plus(l, d);
        if (l instanceof DurationValue d && Temporals.isTemporal(r)) return Temporals.plus(r, d);
        if (l instanceof String s && (r instanceof String || Values.isNumber(r) || r instanceof Boolean)) return s + text(r);
        if (r instanceof String s && (Values.isNumber(l) || l instanceof Boolean)) return text(l) + s;
        if (l instanceof Long a && r instanceof Long b) {
            try { return Math.addExact(a, b); } catch (ArithmeticException e) { throw overflow(); }
        }
        if (Values.isNumber(l) && Values.isNumber(r)) return ((Number) l).doubleValue() + ((Number) r).doubleValue();
        throw typeError("+", l, r);
    }

    private static String text(Object v) {
        return v instanceof Double d ? Values.formatFloat(d) : String.valueOf(v);
    }

    static Object sub(Object l, Object r) {
        if (l == null || r == null) return null;
        if (l instanceof DurationValue a && r instanceof DurationValue b) return a.plus(b.negate());
        if (r instanceof DurationValue d && Temporals.isTemporal(l)) return Temporals.plus(l, d.negate());
        if (l instanceof Long a && r instanceof Long b) {
            try { return Math.subtractExact(a, b); } catch (ArithmeticException e) { throw overflow(); }
        }
        if (Values.isNumber(l) && Values.isNumber(r)) return ((Number) l).doubleValue() - ((Number) r).doubleValue();
        throw typeError("-", l, r);
    }

    static Object mul(Object l, Object r) {
        if (l == null || r == null) return null;
        if (l instanceof DurationValue d && Values.isNumber(r)) return d.times(((Number) r).doubleValue());
        if (r instanceof DurationValue d && Values.isNumber(l)) return d.times(((Number) l).doubleValue());
        if (l instanceof Long a && r instanceof Long b) {
            try { return Math.multiplyExact(a, b); } catch (ArithmeticException e) { throw overflow(); }
        }
        if (Values.isNumber(l) && Values.isNumber(r)) return ((Number) l).doubleValue() * ((Number) r).doubleValue();
        throw typeError("*", l, r);
    }

    static Object div(Object l, Object r) {
        if (l == null || r == null) return null;
        if (l instanceof DurationValue d && Values.isNumber(r)) return d.dividedBy(((Number) r).doubleValue());
        if (l instanceof Long a && r instanceof Long b) {
            if (b == 0) throw EngineException.runtime("division by zero");
            if (a == Long.MIN_VALUE && b == -1) throw overflow();
            return a / b;
        }
        if (Values.isNumber(l) && Values.isNumber(r)) return ((Number) l).doubleValue() / ((Number) r).doubleValue();
        throw typeError("/", l, r);
    }

    static Object mod(Object l, Object r) {
        if (l == null || r == null) return null;
        if (l instanceof Long a && r instanceof Long b) {
            if (b == 0) throw EngineException.runtime("division by zero");
            return a % b;
        }
        if (Values.isNumber(l) && Values.isNumber(r)) return ((Number) l).doubleValue() % ((Number) r).doubleValue();
        throw typeError("%", l, r);
    }

    static Object pow(Object l, Object r) {
        if (l == null || r == null) return null;
        if (Values.isNumber(l) && Values.isNumber(r)) return Math.pow(((Number) l).doubleValue(), ((Number) r).doubleValue());
        throw typeError("^", l, r);
    }

    static Object negate(Object v) {
        if (v == null) return null;
        if (v instanceof Long l) {
            try { return Math.negateExact(l); } catch (ArithmeticException e) { throw overflow(); }
        }
        if (v instanceof Double d) return -d;
        if (v instanceof DurationValue d) return d.negate();
        throw EngineException.runtime("cannot negate a " + Values.typeName(v));
    }

    private static EngineException overflow() {
        return EngineException.runtime("integer overflow");
    }

    private static EngineException typeError(String op, Object l, Object r) {
        return EngineException.runtime("cannot apply " + op + " to " + Values.typeName(l) + " and " + Values.typeName(r));
    }
}
