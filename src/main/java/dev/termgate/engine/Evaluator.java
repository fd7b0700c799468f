package dev.termgate.engine;

import dev.termgate.query.Expr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;

import java.util.ArrayList;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

/**
 * Client-side evaluation of expressions with openCypher semantics: ternary logic with null, integer vs
 * float arithmetic (integer overflow is an error), list and map values, the standard function library.
 * Aggregate calls are not computed here: the projection computes them per group and passes their values in.
 */
final class Evaluator {

    /** What expressions need from the clause engine: pattern predicates and subqueries. */
    interface Host {
        List<Row> matchPattern(Pattern pattern, Optional<Expr> where, Row row);

        List<Row> runSubquery(Query query, Row row);

        NodeValue nodeById(Object id);

        Map<String, Object> params();

        RunControl control();

        dev.termgate.schema.GraphSchema schema();
    }

    private final Host host;
    private final Functions functions;

    Evaluator(Host host) {
        this.host = host;
        this.functions = new Functions(host);
    }

    Object eval(Expr e, Row row) {
        return eval(e, row, null);
    }

    /** @param aggregates values of the aggregate calls of the current group, or null outside aggregation */
    Object eval(Expr e, Row row, IdentityHashMap<Expr, Object> aggregates) {

            if (e instanceof Expr.Variable v) {
                if (!row.has(v.name())) throw EngineException.runtime("variable '" + v.name() + "' is not defined");
                return row.get(v.name());
            }
            if (e instanceof Expr.Parameter p) {
                Map<String, Object> params = host.params();
                if (!params.containsKey(p.name())) throw EngineException.runtime("parameter $" + p.name() + " has no value");
                return params.get(p.name());
            }
            if (e instanceof Expr.IntegerLit i) return i.value();
            if (e instanceof Expr.FloatLit f) return f.value();
            if (e instanceof Expr.StringLit s) return s.value();
            if (e instanceof Expr.BooleanLit b) return b.value();
            if (e instanceof Expr.NullLit n) return null;
            if (e instanceof Expr.ListLit l) {
                List<Object> out = new ArrayList<>(l.elements().size());
                for (Expr x : l.elements()) out.add(eval(x, row, aggregates));
                return Collections.unmodifiableList(out);
            }
            if (e instanceof Expr.MapLit m) {
                Map<String, Object> out = new LinkedHashMap<>();
                for (Expr.MapEntry en : m.entries()) out.put(en.key(), eval(en.value(), row, aggregates));
                return Collections.unmodifiableMap(out);
            }
            if (e instanceof Expr.Binary b) return binary(b, row, aggregates);
            if (e instanceof Expr.Unary u) return unary(u, row, aggregates);
            if (e instanceof Expr.IsNull n) {
                Object v = eval(n.operand(), row, aggregates);
                return n.negated() ? v != null : v == null;
            }
            if (e instanceof Expr.Property p) return property(eval(p.target(), row, aggregates), p.key());
            if (e instanceof Expr.HasLabels h) {
                Object t = eval(h.target(), row, aggregates);
                if (t == null) return null;
                if (!(t instanceof NodeValue n)) {
                    if (t instanceof RelValue r) {
                        return GraphPort.matches(h.labels(), java.util.Set.of(r.type()), host.schema(), false);
                    }
                    throw EngineException.runtime("label test on a " + Values.typeName(t));
                }
                return GraphPort.matches(h.labels(), new java.util.HashSet<>(n.labels()), host.schema(), true);
            }
            if (e instanceof Expr.Subscript s) return subscript(eval(s.target(), row, aggregates), eval(s.index(), row, aggregates));
            if (e instanceof Expr.Slice s) return slice(eval(s.target(), row, aggregates),
                    s.from().map(x -> eval(x, row, aggregates)).orElse(null), s.from().isPresent(),
                    s.to().map(x -> eval(x, row, aggregates)).orElse(null), s.to().isPresent());
            if (e instanceof Expr.FunctionCall f) {
                if (Aggregation.isAggregate(f)) return aggregateValue(f, aggregates);
                List<Object> args = new ArrayList<>(f.args().size());
                String name = f.qualifiedName().toLowerCase(Locale.ROOT);
                if (name.equals("coalesce")) {
                    for (Expr a : f.args()) {
                        Object v = eval(a, row, aggregates);
                        if (v != null) return v;
                    }
                    return null;
                }
                for (Expr a : f.args()) args.add(eval(a, row, aggregates));
                return functions.call(name, args, f);
            }
            if (e instanceof Expr.CountStar c) return aggregateValue(c, aggregates);
            if (e instanceof Expr.Case c) return caseExpr(c, row, aggregates);
            if (e instanceof Expr.ListComprehension lc) {
                Object src = eval(lc.source(), row, aggregates);
                if (src == null) return null;
                List<Object> out = new ArrayList<>();
                for (Object item : asList(src, "list comprehension")) {
                    host.control().check();
                    Row inner = row.with(lc.variable().name(), item);
                    if (lc.where().isPresent() && !Values.isTrue(eval(lc.where().get(), inner, aggregates))) continue;
                    out.add(lc.map().isPresent() ? eval(lc.map().get(), inner, aggregates) : item);
                }
                return Collections.unmodifiableList(out);
            }
            if (e instanceof Expr.Quantified q) return quantified(q, row, aggregates);
            if (e instanceof Expr.Reduce r) {
                Object src = eval(r.source(), row, aggregates);
                if (src == null) return null;
                Object acc = eval(r.init(), row, aggregates);
                for (Object item : asList(src, "reduce")) {
                    Row inner = row.with(r.accumulator().name(), acc).with(r.variable().name(), item);
                    acc = eval(r.map(), inner, aggregates);
                }
                return acc;
            }
            if (e instanceof Expr.PatternPredicate pp) return !host.matchPattern(
                    new Pattern(List.of(pp.pattern()), pp.span()), Optional.empty(), row).isEmpty();
            if (e instanceof Expr.PatternComprehension pc) {
                List<Object> out = new ArrayList<>();
                for (Row m : host.matchPattern(new Pattern(List.of(pc.pattern()), pc.span()), pc.where(), row)) {
                    out.add(eval(pc.map(), m, aggregates));
                }
                return Collections.unmodifiableList(out);
            }
            if (e instanceof Expr.ExistsSubquery ex) {
                if (ex.query().isPresent()) return !host.runSubquery(ex.query().get(), row).isEmpty();
                return !host.matchPattern(ex.pattern().orElseThrow(), ex.where(), row).isEmpty();
            }
            if (e instanceof Expr.CountSubquery cs) {
                if (cs.query().isPresent()) return (long) host.runSubquery(cs.query().get(), row).size();
                return (long) host.matchPattern(cs.pattern().orElseThrow(), cs.where(), row).size();
            }
            if (e instanceof Expr.MapProjection mp) return mapProjection(mp, row, aggregates);
            throw new IllegalStateException("unhandled " + e);

    }

    private Object aggregateValue(Expr call, IdentityHashMap<Expr, Object> aggregates) {
        if (aggregates == null || !aggregates.containsKey(call)) {
            throw EngineException.runtime("aggregation is not allowed here");
        }
        return aggregates.get(call);
    }

    // ---- operators ----

    private Object binary(Expr.Binary b, Row row, IdentityHashMap<Expr, Object> ag) {
        switch (b.op()) {
            case AND -> {
                Object l = eval(b.left(), row, ag);
                if (Boolean.FALSE.equals(bool(l))) return false;
                Object r = eval(b.right(), row, ag);
                if (Boolean.FALSE.equals(bool(r))) return false;
                return l == null || r == null ? null : true;
            }
            case OR -> {
                Object l = eval(b.left(), row, ag);
                if (Boolean.TRUE.equals(bool(l))) return true;
                Object r = eval(b.right(), row, ag);
                if (Boolean.TRUE.equals(bool(r))) return true;
                return l == null || r == null ? null : false;
            }
            case XOR -> {
                Object l = bool(eval(b.left(), row, ag));
                Object r = bool(eval(b.right(), row, ag));
                return l == null || r == null ? null : !l.equals(r);
            }
            default -> {
                Object l = eval(b.left(), row, ag);
                Object r = eval(b.right(), row, ag);
                return apply(b.op(), l, r);
            }
        }
    }

    static Object apply(Expr.BinaryOp op, Object l, Object r) {
        if (op.isComparison() && op != Expr.BinaryOp.EQ && op != Expr.BinaryOp.NE && (isNaN(l) && Values.isNumber(r) || isNaN(r) && Values.isNumber(l))) {
            return false;
        }
        return switch (op) {
            case EQ -> Values.eq(l, r);
            case NE -> { Boolean e = Values.eq(l, r); yield e == null ? null : !e; }
            case LT -> { Integer c = Values.compare(l, r); yield c == null ? null : c < 0; }
            case GT -> { Integer c = Values.compare(l, r); yield c == null ? null : c > 0; }
            case LE -> { Integer c = Values.compare(l, r); yield c == null ? null : c <= 0; }
            case GE -> { Integer c = Values.compare(l, r); yield c == null ? null : c >= 0; }
            case ADD -> Arith.add(l, r);
            case SUB -> Arith.sub(l, r);
            case MUL -> Arith.mul(l, r);
            case DIV -> Arith.div(l, r);
            case MOD -> Arith.mod(l, r);
            case POW -> Arith.pow(l, r);
            case STARTS_WITH -> l instanceof String s && r instanceof String t ? s.startsWith(t) : null;
            case ENDS_WITH -> l instanceof String s && r instanceof String t ? s.endsWith(t) : null;
            case CONTAINS -> l instanceof String s && r instanceof String t ? s.contains(t) : null;
            case IN -> in(l, r);
            case REGEX -> {
                if (!(l instanceof String s) || !(r instanceof String t)) yield null;
                try {
                    yield java.util.regex.Pattern.compile(t).matcher(s).matches();
                } catch (java.util.regex.PatternSyntaxException ex) {
                    throw EngineException.runtime("invalid regular expression: " + ex.getDescription());
                }
            }
            case AND, OR, XOR -> throw new IllegalStateException("handled with short-circuit");
        };
    }

    private static boolean isNaN(Object v) {
        return v instanceof Double d && d.isNaN();
    }

    static Object in(Object l, Object r) {
        if (r == null) return null;
        if (!(r instanceof List<?> list)) throw EngineException.runtime("IN expects a list, got " + Values.typeName(r));
        boolean unknown = false;
        for (Object o : list) {
            Boolean e = Values.eq(l, o);
            if (e == null) unknown = true;
            else if (e) return true;
        }
        return unknown ? null : false;
    }

    private static Boolean bool(Object v) {
        if (v == null) return null;
        if (v instanceof Boolean b) return b;
        throw EngineException.runtime("expected a boolean, got " + Values.typeName(v));
    }

    private Object unary(Expr.Unary u, Row row, IdentityHashMap<Expr, Object> ag) {
        Object v = eval(u.operand(), row, ag);
        return switch (u.op()) {
            case NOT -> { Boolean b = bool(v); yield b == null ? null : !b; }
            case MINUS -> Arith.negate(v);
            case PLUS -> {
                if (v == null || Values.isNumber(v)) yield v;
                throw EngineException.runtime("unary + on a " + Values.typeName(v));
            }
        };
    }

    static Object property(Object target, String key) {
        if (target == null) return null;
        if (target instanceof NodeValue n) return n.properties().get(key);
        if (target instanceof RelValue r) return r.properties().get(key);
        if (target instanceof Map<?, ?> m) return m.get(key);
        if (Temporals.isTemporal(target)) return Temporals.property(target, key);
        throw EngineException.runtime("cannot read property '" + key + "' of a " + Values.typeName(target));
    }

    static Object subscript(Object target, Object index) {
        if (target == null || index == null) return null;
        if (target instanceof List<?> l) {
            if (!(index instanceof Long i)) throw EngineException.runtime("list index must be an integer, got " + Values.typeName(index));
            long k = i < 0 ? l.size() + i : i;
            return k < 0 || k >= l.size() ? null : l.get((int) k);
        }
        if (index instanceof String key && (target instanceof Map || target instanceof NodeValue || target instanceof RelValue)) {
            return property(target, key);
        }
        throw EngineException.runtime("cannot index a " + Values.typeName(target) + " with a " + Values.typeName(index));
    }

    static Object slice(Object target, Object from, boolean hasFrom, Object to, boolean hasTo) {
        if (target == null) return null;
        if ((hasFrom && from == null) || (hasTo && to == null)) return null;
        List<?> l = asList(target, "slice");
        int n = l.size();
        long f = hasFrom ? ((Number) from).longValue() : 0;
        long t = hasTo ? ((Number) to).longValue() : n;
        if (f < 0) f += n;
        if (t < 0) t += n;
        f = Math.max(0, Math.min(n, f));
        t = Math.max(0, Math.min(n, t));
        if (t <= f) return List.of();
        return Collections.unmodifiableList(new ArrayList<>(l.subList((int) f, (int) t)));
    }

    static List<?> asList(Object v, String where) {
        if (v instanceof List<?> l) return l;
        throw EngineException.runtime(where + " expects a list, got " + Values.typeName(v));
    }

    private Object caseExpr(Expr.Case c, Row row, IdentityHashMap<Expr, Object> ag) {
        if (c.subject().isPresent()) {
            Object subject = eval(c.subject().get(), row, ag);
            for (Expr.CaseWhen w : c.whens()) {
                if (Boolean.TRUE.equals(Values.eq(subject, eval(w.when(), row, ag)))) return eval(w.then(), row, ag);
            }
        } else {
            for (Expr.CaseWhen w : c.whens()) {
                if (Values.isTrue(eval(w.when(), row, ag))) return eval(w.then(), row, ag);
            }
        }
        return c.otherwise().isPresent() ? eval(c.otherwise().get(), row, ag) : null;
    }

    private Object quantified(Expr.Quantified q, Row row, IdentityHashMap<Expr, Object> ag) {
        Object src = eval(q.source(), row, ag);
        if (src == null) return null;
        int trues = 0, unknowns = 0, total = 0;
        for (Object item : asList(src, q.quantifier().name().toLowerCase(Locale.ROOT))) {
            total++;
            Object v = q.where().isPresent() ? eval(q.where().get(), row.with(q.variable().name(), item), ag) : item;
            if (v == null) unknowns++;
            else if (Boolean.TRUE.equals(bool(v))) trues++;
        }
        int falses = total - trues - unknowns;
        Boolean unknown = null;
        switch (q.quantifier()) {
            case ALL: return falses > 0 ? Boolean.FALSE : (unknowns > 0 ? unknown : Boolean.TRUE);
            case ANY: return trues > 0 ? Boolean.TRUE : (unknowns > 0 ? unknown : Boolean.FALSE);
            case NONE: return trues > 0 ? Boolean.FALSE : (unknowns > 0 ? unknown : Boolean.TRUE);
            default: return trues > 1 ? Boolean.FALSE : (unknowns > 0 ? unknown : Boolean.valueOf(trues == 1));
        }
    }

    private Object mapProjection(Expr.MapProjection mp, Row row, IdentityHashMap<Expr, Object> ag) {
        Object base = eval(mp.variable(), row, ag);
        if (base == null) return null;
        Map<String, Object> props;
        if (base instanceof NodeValue n) props = n.properties();
        else if (base instanceof RelValue r) props = r.properties();
        else if (base instanceof Map<?, ?> m) {
            props = new LinkedHashMap<>();
            for (Map.Entry<?, ?> en : m.entrySet()) props.put(String.valueOf(en.getKey()), en.getValue());
        } else throw EngineException.runtime("map projection on a " + Values.typeName(base));
        Map<String, Object> out = new LinkedHashMap<>();
        for (Expr.MapItem item : mp.items()) {
            if (item instanceof Expr.PropertySelector ps) out.put(ps.key(), props.get(ps.key()));
            else if (item instanceof Expr.LiteralEntry le) out.put(le.key(), eval(le.value(), row, ag));
            else if (item instanceof Expr.VariableSelector vs) out.put(vs.variable().name(), eval(vs.variable(), row, ag));
            else if (item instanceof Expr.AllProperties) out.putAll(props);
        }
        return Collections.unmodifiableMap(out);
    }
}
