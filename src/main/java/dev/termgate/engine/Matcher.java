package dev.termgate.engine;

import dev.termgate.query.Expr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Trees;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.process.traversal.Compare;
import org.apache.tinkerpop.gremlin.process.traversal.P;
import org.apache.tinkerpop.gremlin.process.traversal.TextP;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.GraphTraversal;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.__;
import org.apache.tinkerpop.gremlin.structure.Vertex;

import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.HashSet;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalLong;
import java.util.Set;

/**
 * Matches MATCH patterns against the graph. A path part with fixed-length relationships compiles into ONE
 * lambda-free traversal (labels, types, directions, property predicates and pushed-down WHERE conjuncts as
 * {@code has}/{@code hasLabel} steps, bindings returned by {@code select(...).by(elementMap())}); a part with a
 * variable-length relationship is expanded hop by hop on the client, each hop being a lambda-free traversal,
 * so that relationship uniqueness and the limits are enforced between hops. Everything the traversal
 * filters is re-checked on the client with openCypher semantics, so pushdown can only make things faster.
 */
final class Matcher {
    /** Off only to compare with scans and the planner's order before it (LabelIndexDifferentialTest, EngineBench). */
    static volatile boolean labelIndex = true;

    private final GraphPort port;
    private final GraphSchema schema;
    private final Evaluator ev;
    private final RunControl control;
    private final Map<Expr, List<Pushdown>> pushdownCache = new IdentityHashMap<>();
    private final Map<String, List<Object[]>> hopCache = new HashMap<>();

    Matcher(GraphPort port, GraphSchema schema, Evaluator ev, RunControl control) {
        this.port = port;
        this.schema = schema;
        this.ev = ev;
        this.control = control;
    }

    /** A WHERE conjunct of the form {@code var.key OP value} where value is fixed for the row. */
    record Pushdown(String var, String key, Expr.BinaryOp op, Expr value, boolean notNull) {}

    /**
     * The pattern as it will run. A fixed-length part keeps its written order and starts from node {@code start}
     * (the most selective one: bound, or looked up by property equality), walking right to the end and then
     * back left from the start; a variable-length part is expanded from one end, so it may be reversed instead.
     */
    record PartPlan(List<Pattern.NodePattern> nodes, List<Pattern.RelPattern> rels, List<String> nodeVars,
                    List<String> relVars, boolean reversed, Optional<String> pathVar, boolean varLength, int start,
                    Pattern.PathKind kind) {}

    // ---------------------------------------------------------------- whole patterns

    /** Every match of the pattern extending the row, with relationship uniqueness across the whole pattern. */
    List<Row> match(Pattern pattern, Optional<Expr> where, Row row, long limit) {
        List<Pushdown> pushed = where.map(this::pushdowns).orElse(List.of());
        List<Row> rows = List.of(row);
        Set<String> relVars = new HashSet<>();
        for (Pattern.Part part : pattern.parts()) {
            List<Row> next = new ArrayList<>();
            for (Row r : rows) {
                control.check();
                PartPlan plan = plan(part, r, pushed);
                relVars.addAll(plan.relVars());
                next.addAll(matchPart(plan, r, pushed));
                control.checkSize(next.size());
            }
            rows = next;
            if (rows.isEmpty()) break;
        }
        List<Row> out = new ArrayList<>(rows.size());
        for (Row r : rows) {
            if (relVars.size() > 1 && !relationshipsUnique(r, relVars)) continue;
            out.add(r);
        }
        return out;
    }

    private static boolean relationshipsUnique(Row r, Set<String> relVars) {
        Set<Object> seen = new HashSet<>();
        for (String v : relVars) {
            Object val = r.get(v);
            if (val instanceof RelValue rel) {
                if (!seen.add(Values.idKey(rel.id()))) return false;
            } else if (val instanceof List<?> list) {
                for (Object o : list) {
                    if (o instanceof RelValue rel && !seen.add(Values.idKey(rel.id()))) return false;
                }
            }
        }
        return true;
    }

    // ---------------------------------------------------------------- planning one part

    PartPlan plan(Pattern.Part part, Row row, List<Pushdown> pushed) {
        List<Pattern.NodePattern> nodes = new ArrayList<>(part.nodes());
        List<Pattern.RelPattern> rels = new ArrayList<>();
        part.steps().forEach(s -> rels.add(s.rel()));
        List<String> nodeVars = new ArrayList<>();
        List<String> relVars = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            Pattern.NodePattern n = nodes.get(i);
            nodeVars.add(n.variable().map(Expr.Variable::name).orElse(Row.Names.hidden("n", n.span().startOffset(), i)));
        }
        for (int i = 0; i < rels.size(); i++) {
            Pattern.RelPattern r = rels.get(i);
            relVars.add(r.variable().map(Expr.Variable::name).orElse(Row.Names.hidden("r", r.span().startOffset(), i)));
        }
        boolean varLength = rels.stream().anyMatch(r -> r.length().isPresent());
        // A shortest-path search runs from one end to the other, like a variable-length expansion.
        varLength |= part.kind() != Pattern.PathKind.PLAIN;
        int best = 0;
        int bestScore = score(nodes.get(0), nodeVars.get(0), row, pushed);
        for (int i = 1; i < nodes.size(); i++) {
            int sc = score(nodes.get(i), nodeVars.get(i), row, pushed);
            // A variable-length part can only start at an end.
            if ((sc > bestScore || sc == bestScore && fewerVertices(nodes.get(i), nodes.get(best)))
                    && (!varLength || i == nodes.size() - 1)) {
                best = i;
                bestScore = sc;
            }
        }
        boolean reverse = varLength && best > 0;
        if (reverse) {
            Collections.reverse(nodes);
            Collections.reverse(nodeVars);
            Collections.reverse(rels);
            Collections.reverse(relVars);
            rels.replaceAll(Matcher::flipped);
        }
        return new PartPlan(nodes, rels, nodeVars, relVars, reverse, part.pathVariable().map(Expr.Variable::name), varLength,
                reverse ? 0 : best, part.kind());
    }

    /**
     * How selective starting from a node is: a bound node is one lookup by id; a property equality (inline
     * map or WHERE conjunct) is an index probe; a range or text predicate and a label narrow a scan less.
     */
    private static int score(Pattern.NodePattern n, String var, Row row, List<Pushdown> pushed) {
        if (row.has(var)) return 100;
        int s = 0;
        if (n.properties().isPresent()) s += 10;
        for (Pushdown p : pushed) {
            if (p.var().equals(var)) s += p.op() == Expr.BinaryOp.EQ || p.op() == Expr.BinaryOp.IN ? 10 : 3;
        }
        if (n.labels().isPresent()) s += 5;
        return s;
    }

    /**
     * Between two starts that score alike: on the embedded graph, whose label index counts each label's vertices,
     * the node whose labels have fewer vertices ({@code (pc:PortCall)-[:AT_PORT]->(p:Port)} starts at the ports).
     */
    private boolean fewerVertices(Pattern.NodePattern a, Pattern.NodePattern b) {
        if (!labelIndex || a.labels().isEmpty() || b.labels().isEmpty()) return false;
        OptionalLong na = port.vertexCount(a.labels().get(), schema);
        OptionalLong nb = port.vertexCount(b.labels().get(), schema);
        return na.isPresent() && nb.isPresent() && na.getAsLong() < nb.getAsLong();
    }

    private static Pattern.RelPattern flipped(Pattern.RelPattern r) {
        Pattern.Direction d = switch (r.direction()) {
            case OUTGOING -> Pattern.Direction.INCOMING;
            case INCOMING -> Pattern.Direction.OUTGOING;
            case BOTH -> Pattern.Direction.BOTH;
        };
        return new Pattern.RelPattern(d, r.variable(), r.types(), r.length(), r.properties(), r.span());
    }

    // ---------------------------------------------------------------- WHERE pushdown

    List<Pushdown> pushdowns(Expr where) {
        return pushdownCache.computeIfAbsent(where, w -> {
            List<Pushdown> out = new ArrayList<>();
            for (Expr c : conjuncts(w)) {
                Pushdown p = asPushdown(c);
                if (p != null) out.add(p);
            }
            return out;
        });
    }

    static List<Expr> conjuncts(Expr e) {
        if (e instanceof Expr.Binary b && b.op() == Expr.BinaryOp.AND) {
            List<Expr> out = new ArrayList<>(conjuncts(b.left()));
            out.addAll(conjuncts(b.right()));
            return out;
        }
        return List.of(e);
    }

    static Pushdown asPushdown(Expr c) {
        if (c instanceof Expr.IsNull n && n.negated() && n.operand() instanceof Expr.Property p
                && p.target() instanceof Expr.Variable v) {
            return new Pushdown(v.name(), p.key(), null, null, true);
        }
        if (!(c instanceof Expr.Binary b)) return null;
        Expr.BinaryOp op = b.op();
        switch (op) {
            case EQ, NE, LT, GT, LE, GE, STARTS_WITH, ENDS_WITH, CONTAINS, IN -> { }
            default -> { return null; }
        }
        if (b.left() instanceof Expr.Property p && p.target() instanceof Expr.Variable v && isConstantish(b.right())) {
            return new Pushdown(v.name(), p.key(), op, b.right(), false);
        }
        if (op.isComparison() && b.right() instanceof Expr.Property p && p.target() instanceof Expr.Variable v
                && isConstantish(b.left())) {
            return new Pushdown(v.name(), p.key(), mirror(op), b.left(), false);
        }
        return null;
    }

    private static Expr.BinaryOp mirror(Expr.BinaryOp op) {
        return switch (op) {
            case LT -> Expr.BinaryOp.GT;
            case GT -> Expr.BinaryOp.LT;
            case LE -> Expr.BinaryOp.GE;
            case GE -> Expr.BinaryOp.LE;
            default -> op;
        };
    }

    /** Literals and parameters only: their value is the same for every candidate. */
    private static boolean isConstantish(Expr e) {
        for (var n : Trees.find(e, dev.termgate.query.Node.class)) {
            if (!(n instanceof Expr.IntegerLit || n instanceof Expr.FloatLit || n instanceof Expr.StringLit
                    || n instanceof Expr.BooleanLit || n instanceof Expr.Parameter || n instanceof Expr.ListLit)) {
                return false;
            }
        }
        return true;
    }

    /** The Gremlin predicate for a pushed-down conjunct, or null when its value cannot be compared exactly. */
    private P<?> predicate(Pushdown p, Row row) {
        if (p.notNull()) return null;
        Object v = ev.eval(p.value(), row);
        if (p.op() == Expr.BinaryOp.IN) {
            if (!(v instanceof List<?> l)) return null;
            for (Object o : l) if (!isScalar(o)) return null;
            return P.within(new ArrayList<>(l));
        }
        if (!isScalar(v)) return null;
        return switch (p.op()) {
            case EQ -> equality(v);
            case NE -> P.neq(v);
            case LT -> P.lt(v);
            case GT -> P.gt(v);
            case LE -> P.lte(v);
            case GE -> P.gte(v);
            case STARTS_WITH -> v instanceof String s ? TextP.startingWith(s) : null;
            case ENDS_WITH -> v instanceof String s ? TextP.endingWith(s) : null;
            case CONTAINS -> v instanceof String s ? TextP.containing(s) : null;
            default -> null;
        };
    }

    /**
     * {@code eq} for strings, which lets the graph answer from an index; {@code within} for numbers and
     * booleans, which compares the same way (1 = 1.0) but never uses an index, because an index probes by exact
     * stored value and would miss 1.0 when asked for 1.
     */
    private static P<?> equality(Object v) {
        return v instanceof String ? P.eq(v) : P.within(List.of(v));
    }

    private static boolean isScalar(Object v) {
        return v instanceof String || v instanceof Long || v instanceof Boolean
                || v instanceof Double d && !d.isNaN();
    }

    // ---------------------------------------------------------------- running one part

    private List<Row> matchPart(PartPlan plan, Row row, List<Pushdown> pushed) {
        for (String v : plan.nodeVars()) if (row.has(v) && !(row.get(v) instanceof NodeValue)) return List.of();
        for (String v : plan.relVars()) {
            if (row.has(v) && row.get(v) != null && !(row.get(v) instanceof RelValue || row.get(v) instanceof List)) return List.of();
            if (row.has(v) && row.get(v) == null) return List.of();
        }
        List<Row> raw = plan.kind() != Pattern.PathKind.PLAIN ? shortestPaths(plan, row, pushed)
                : plan.varLength() ? expandPart(plan, row, pushed) : traversePart(plan, row, pushed);
        List<Row> out = new ArrayList<>(raw.size());
        for (Row r : raw) {
            if (checkProperties(plan, r)) out.add(r);
        }
        return out;
    }

    /** The client-side check of inline property maps (exact openCypher equality). */
    private boolean checkProperties(PartPlan plan, Row r) {
        for (int i = 0; i < plan.nodes().size(); i++) {
            Pattern.NodePattern n = plan.nodes().get(i);
            if (n.properties().isPresent() && !propsMatch(n.properties().get(), r.get(plan.nodeVars().get(i)), r)) return false;
        }
        for (int i = 0; i < plan.rels().size(); i++) {
            Pattern.RelPattern rel = plan.rels().get(i);
            if (rel.properties().isEmpty()) continue;
            Object v = r.get(plan.relVars().get(i));
            if (v instanceof List<?> list) {
                for (Object o : list) if (!propsMatch(rel.properties().get(), o, r)) return false;
            } else if (!propsMatch(rel.properties().get(), v, r)) return false;
        }
        return true;
    }

    private boolean propsMatch(Expr propsExpr, Object element, Row r) {
        Object m = ev.eval(propsExpr, r);
        if (m == null) return true;
        if (!(m instanceof Map<?, ?> map)) throw EngineException.runtime("pattern properties must be a map");
        for (Map.Entry<?, ?> e : map.entrySet()) {
            Object have = Evaluator.property(element, String.valueOf(e.getKey()));
            if (!Boolean.TRUE.equals(Values.eq(have, e.getValue()))) return false;
        }
        return true;
    }

    /**
     * Builds the single traversal of a fixed-length part, starting at node {@code plan.start()}: rightwards to
     * the last node, then from the start back leftwards; null when it can match nothing. Steps are labelled by
     * their written position ({@code n0..nk}, {@code r0..rk-1}), whatever order they run in.
     */
    GraphTraversal<Vertex, ?> compile(PartPlan plan, Row row, List<Pushdown> pushed, boolean explain) {
        GraphTraversal<Vertex, Vertex> t = compileSteps(plan, row, pushed, explain);
        if (t == null) return null;
        int k = plan.rels().size();
        if (k == 0) return t.elementMap();
        String[] rest = new String[2 * k];
        for (int i = 0; i < k; i++) {
            rest[2 * i] = "r" + i;
            rest[2 * i + 1] = "n" + (i + 1);
        }
        return t.select("n0", rest[0], java.util.Arrays.copyOfRange(rest, 1, rest.length)).by(__.elementMap());
    }

    /**
     * The matching steps of {@link #compile} without the final read-out: every match is one traverser whose
     * path labels {@code n0..nk} and {@code r0..rk-1} hold its elements (ProjectionPushdown appends its own
     * grouping to this); null when it can match nothing.
     */
    @SuppressWarnings("unchecked")
    GraphTraversal<Vertex, Vertex> compileSteps(PartPlan plan, Row row, List<Pushdown> pushed, boolean explain) {
        int s = plan.start();
        GraphTraversal<Vertex, Vertex> t = start(plan, s, row, pushed, explain);
        if (t == null) return null;
        t.as("n" + s);
        List<Integer> visitedNodes = new ArrayList<>(List.of(s));
        List<Integer> visitedRels = new ArrayList<>();
        int k = plan.rels().size();
        for (int i = s; i < k; i++) {
            t = hop(t, plan, i, plan.rels().get(i), i + 1, row, pushed, explain, visitedNodes, visitedRels);
            if (t == null) return null;
        }
        if (s > 0 && s < k) t = (GraphTraversal<Vertex, Vertex>) (GraphTraversal<Vertex, ?>) t.select("n" + s);
        for (int i = s - 1; i >= 0; i--) {
            t = hop(t, plan, i, flipped(plan.rels().get(i)), i, row, pushed, explain, visitedNodes, visitedRels);
            if (t == null) return null;
        }
        return t;
    }

    /**
     * The vertices node {@code s} may be, filtered: the bound one; on the embedded graph, when the node has a label
     * and no equality for the property index to answer, its label's vertices looked up by id (when they are few
     * enough, see {@link GraphPort#selectiveVertexIds}; {@code $labelIndex} in a plan); otherwise every vertex. Null
     * when nothing can match.
     */
    private GraphTraversal<Vertex, Vertex> start(PartPlan plan, int s, Row row, List<Pushdown> pushed, boolean explain) {
        String var = plan.nodeVars().get(s);
        if (row.has(var)) {
            GraphTraversal<Vertex, Vertex> t = port.g().V(explain ? "$" + var : ((NodeValue) row.get(var)).id());
            return filterNode(t, plan, s, row, pushed, explain) ? t : null;
        }
        GraphTraversal<Vertex, Vertex> t = port.g().V();
        if (!filterNode(t, plan, s, row, pushed, explain)) return null;
        Pattern.NodePattern n = plan.nodes().get(s);
        if (n.labels().isEmpty() || !labelIndex || probesIndex(t)) return t;
        Optional<Object[]> ids = port.selectiveVertexIds(n.labels().get(), schema);
        if (ids.isEmpty()) return t;
        GraphTraversal<Vertex, Vertex> byId = port.g().V(explain ? new Object[] {"$labelIndex"} : ids.get());
        filterNode(byId, plan, s, row, pushed, explain);
        return byId;
    }

    /** Whether the start's steps hold an equality the embedded graph's property index answers (see {@link #has}). */
    private static boolean probesIndex(GraphTraversal<?, ?> t) {
        for (var step : t.asAdmin().getBytecode().getStepInstructions()) {
            Object[] args = step.getArguments();
            if (step.getOperator().equals("has") && args.length == 2 && args[1] instanceof P<?> p
                    && p.getBiPredicate() == Compare.eq) {
                return true;
            }
        }
        return false;
    }

    /**
     * Appends relationship {@code ri} (walked in the direction {@code rel} gives) and its far node {@code ni};
     * relationship uniqueness and a variable repeated within the part become {@code where} steps.
     */
    private GraphTraversal<Vertex, Vertex> hop(GraphTraversal<Vertex, Vertex> t, PartPlan plan, int ri, Pattern.RelPattern rel,
                                               int ni, Row row, List<Pushdown> pushed, boolean explain,
                                               List<Integer> visitedNodes, List<Integer> visitedRels) {
        String[] types = edgeLabels(rel);
        if (types == null) return null;
        GraphTraversal<Vertex, org.apache.tinkerpop.gremlin.structure.Edge> e = switch (rel.direction()) {
            case OUTGOING -> t.outE(types);
            case INCOMING -> t.inE(types);
            case BOTH -> t.bothE(types);
        };
        String rv = plan.relVars().get(ri);
        if (row.has(rv) && row.get(rv) instanceof RelValue bound) e.hasId(explain ? "$" + rv : bound.id());
        applyPushdowns(e, rv, row, pushed, explain, false);
        pushInline(e, rel.properties(), row, explain, false);
        e.as("r" + ri);
        for (int j : visitedRels) e.where("r" + ri, P.neq("r" + j));
        visitedRels.add(ri);
        GraphTraversal<Vertex, Vertex> next = switch (rel.direction()) {
            case OUTGOING -> e.inV();
            case INCOMING -> e.outV();
            case BOTH -> e.otherV();
        };
        if (!filterNode(next, plan, ni, row, pushed, explain)) return null;
        next.as("n" + ni);
        for (int j : visitedNodes) {
            if (plan.nodeVars().get(j).equals(plan.nodeVars().get(ni))) {
                next.where("n" + ni, P.eq("n" + j));
                break;
            }
        }
        visitedNodes.add(ni);
        return next;
    }

    private String[] edgeLabels(Pattern.RelPattern rel) {
        if (rel.types().isEmpty()) return new String[0];
        List<String> labels = port.edgeLabelsMatching(rel.types().get(), schema);
        return labels.isEmpty() ? null : labels.toArray(String[]::new);
    }

    /**
     * Adds label, bound-id and property steps for node i; false when no stored label can match. On the node a
     * traversal starts from (no bound id), the property equalities are what the graph's index answers.
     */
    private boolean filterNode(GraphTraversal<?, Vertex> t, PartPlan plan, int i, Row row, List<Pushdown> pushed, boolean explain) {
        Pattern.NodePattern n = plan.nodes().get(i);
        String var = plan.nodeVars().get(i);
        boolean bound = row.has(var);
        if (i != plan.start() && bound) t.hasId(explain ? "$" + var : ((NodeValue) row.get(var)).id());
        if (n.labels().isPresent()) {
            List<String> stored = port.vertexLabelsMatching(n.labels().get(), schema);
            if (stored.isEmpty() && !explain) return false;
            if (stored.size() == 1) t.hasLabel(stored.get(0));
            else t.hasLabel(P.within(stored));
        }
        boolean start = i == plan.start() && !bound;
        applyPushdowns(t, var, row, pushed, explain, start);
        pushInline(t, n.properties(), row, explain, start);
        return true;
    }

    private void applyPushdowns(GraphTraversal<?, ?> t, String var, Row row, List<Pushdown> pushed, boolean explain,
                                boolean start) {
        if (row.has(var)) return;
        for (Pushdown p : pushed) {
            if (!p.var().equals(var)) continue;
            if (p.notNull()) {
                t.has(p.key());
                continue;
            }
            P<?> pred = explain ? explainPredicate(p, row) : predicate(p, row);
            if (pred != null) has(t, p.key(), pred, start && !explain);
        }
    }

    /** A property step; an equality on the start node first has the embedded graph index the key. */
    private void has(GraphTraversal<?, ?> t, String key, P<?> pred, boolean start) {
        if (start && pred.getBiPredicate() == Compare.eq) port.indexVertexKey(key);
        t.has(key, pred);
    }

    private P<?> explainPredicate(Pushdown p, Row row) {
        try {
            return predicate(p, row);
        } catch (RuntimeException e) {
            return null;
        }
    }

    private void pushInline(GraphTraversal<?, ?> t, Optional<Expr> props, Row row, boolean explain, boolean start) {
        if (props.isEmpty() || !(props.get() instanceof Expr.MapLit m)) return;
        for (Expr.MapEntry en : m.entries()) {
            if (!isConstantish(en.value()) && !onlyBound(en.value(), row)) continue;
            Object v;
            try {
                v = ev.eval(en.value(), row);
            } catch (RuntimeException ex) {
                if (explain) continue;
                throw ex;
            }
            if (isScalar(v)) has(t, en.key(), equality(v), start && !explain);
        }
    }

    private static boolean onlyBound(Expr e, Row row) {
        for (Expr.Variable v : Trees.find(e, Expr.Variable.class)) if (!row.has(v.name())) return false;
        return Trees.find(e, Expr.PatternPredicate.class).isEmpty();
    }

    private List<Row> traversePart(PartPlan plan, Row row, List<Pushdown> pushed) {
        GraphTraversal<Vertex, ?> t = compile(plan, row, pushed, false);
        if (t == null) return List.of();
        List<Row> out = new ArrayList<>();
        Set<List<Object>> seen = plan.rels().stream().anyMatch(r -> r.direction() == Pattern.Direction.BOTH)
                ? new HashSet<>() : null;
        int k = plan.rels().size();
        try {
            while (t.hasNext()) {
                control.check();
                Object res = t.next();
                NodeValue[] nodes = new NodeValue[k + 1];
                RelValue[] rels = new RelValue[k];
                if (k == 0) {
                    nodes[0] = GraphPort.node(res);
                } else {
                    Map<?, ?> m = (Map<?, ?>) res;
                    nodes[0] = GraphPort.node(m.get("n0"));
                    for (int i = 0; i < k; i++) {
                        rels[i] = GraphPort.rel(m.get("r" + i));
                        nodes[i + 1] = GraphPort.node(m.get("n" + (i + 1)));
                    }
                }
                if (seen != null) {
                    List<Object> key = new ArrayList<>();
                    for (NodeValue n : nodes) key.add(Values.idKey(n.id()));
                    for (RelValue r : rels) key.add(Values.idKey(r.id()));
                    if (!seen.add(key)) continue;
                }
                Row bound = bind(plan, row, List.of(nodes), List.of(rels).stream().map(r -> (Object) r).toList());
                if (bound != null) out.add(bound);
                control.checkSize(out.size());
            }
        } finally {
            closeQuietly(t);
        }
        return out;
    }

    static void closeQuietly(GraphTraversal<?, ?> t) {
        try {
            t.close();
        } catch (Exception ignored) {
            // closing only releases resources; the run's outcome is already decided
        }
    }

    /** Adds the bindings; null when a variable already bound in the row disagrees. */
    private Row bind(PartPlan plan, Row row, List<NodeValue> nodes, List<Object> rels) {
        Map<String, Object> add = new LinkedHashMap<>();
        for (int i = 0; i < nodes.size(); i++) {
            String v = plan.nodeVars().get(i);
            NodeValue n = nodes.get(i);
            Object prev = row.has(v) ? row.get(v) : add.get(v);
            if (prev != null && !prev.equals(n)) return null;
            if (!row.has(v)) add.put(v, n);
        }
        for (int i = 0; i < rels.size(); i++) {
            String v = plan.relVars().get(i);
            Object r = rels.get(i);
            if (plan.reversed() && r instanceof List<?> seg) {
                List<Object> rev = new ArrayList<>(seg);
                Collections.reverse(rev);
                r = Collections.unmodifiableList(rev);
            }
            if (row.has(v)) {
                if (!Boolean.TRUE.equals(Values.eq(row.get(v), r))) return null;
            } else if (add.containsKey(v)) {
                if (!Boolean.TRUE.equals(Values.eq(add.get(v), r))) return null;
            } else add.put(v, r);
        }
        if (plan.pathVar().isPresent()) add.put(plan.pathVar().get(), path(plan, nodes, rels));
        return row.withAll(add);
    }

    private PathValue path(PartPlan plan, List<NodeValue> nodes, List<Object> rels) {
        // Variable-length segments contribute their relationships and the nodes between them.
        List<NodeValue> pn = new ArrayList<>();
        List<RelValue> pr = new ArrayList<>();
        pn.add(nodes.get(0));
        for (int i = 0; i < rels.size(); i++) {
            Object r = rels.get(i);
            List<RelValue> seg = new ArrayList<>();
            if (r instanceof RelValue rv) seg.add(rv);
            else for (Object o : (List<?>) r) seg.add((RelValue) o);
            NodeValue cur = pn.get(pn.size() - 1);
            for (int j = 0; j < seg.size(); j++) {
                RelValue rv = seg.get(j);
                pr.add(rv);
                boolean last = j == seg.size() - 1;
                Object otherId = Values.idKey(rv.start()).equals(Values.idKey(cur.id())) ? rv.end() : rv.start();
                NodeValue next = last ? nodes.get(i + 1) : nodeById(otherId);
                pn.add(next);
                cur = next;
            }
        }
        if (plan.reversed()) {
            Collections.reverse(pn);
            Collections.reverse(pr);
        }
        return new PathValue(pn, pr);
    }

    // ---------------------------------------------------------------- client-side expansion

    private List<Row> expandPart(PartPlan plan, Row row, List<Pushdown> pushed) {
        List<NodeValue> starts = startNodes(plan, row, pushed);
        List<Row> out = new ArrayList<>();
        for (NodeValue s : starts) {
            control.check();
            List<NodeValue> nodes = new ArrayList<>();
            nodes.add(s);
            dfs(plan, row, 0, s, nodes, new ArrayList<>(), new HashSet<>(), out);
        }
        return out;
    }

    private List<NodeValue> startNodes(PartPlan plan, Row row, List<Pushdown> pushed) {
        String first = plan.nodeVars().get(0);
        if (row.has(first)) {
            NodeValue n = (NodeValue) row.get(first);
            return nodeMatches(plan.nodes().get(0), n) ? List.of(n) : List.of();
        }
        PartPlan single = new PartPlan(plan.nodes().subList(0, 1), List.of(), plan.nodeVars().subList(0, 1), List.of(),
                false, Optional.empty(), false, 0, Pattern.PathKind.PLAIN);
        GraphTraversal<Vertex, Vertex> t = start(single, 0, row, pushed, false);
        if (t == null) return List.of();
        List<NodeValue> out = new ArrayList<>();
        GraphTraversal<Vertex, ?> m = t.elementMap();
        try {
            while (m.hasNext()) {
                control.check();
                out.add(GraphPort.node(m.next()));
            }
        } finally {
            closeQuietly(m);
        }
        return out;
    }

    private boolean nodeMatches(Pattern.NodePattern p, NodeValue n) {
        return p.labels().isEmpty() || GraphPort.matches(p.labels().get(), new HashSet<>(n.labels()), schema, true);
    }

    private void dfs(PartPlan plan, Row row, int step, NodeValue cur, List<NodeValue> nodes, List<Object> rels,
                     Set<Object> used, List<Row> out) {
        control.check();
        if (step == plan.rels().size()) {
            Row b = bind(plan, row, nodes, rels);
            if (b != null) out.add(b);
            control.checkSize(out.size());
            return;
        }
        Pattern.RelPattern rel = plan.rels().get(step);
        Pattern.NodePattern target = plan.nodes().get(step + 1);
        String targetVar = plan.nodeVars().get(step + 1);
        if (rel.length().isEmpty()) {
            for (Object[] hop : hops(cur, rel)) {
                RelValue r = (RelValue) hop[0];
                NodeValue next = (NodeValue) hop[1];
                if (used.contains(Values.idKey(r.id())) || !nodeOk(target, targetVar, next, row)) continue;
                String rv = plan.relVars().get(step);
                if (row.has(rv) && !r.equals(row.get(rv))) continue;
                used.add(Values.idKey(r.id()));
                nodes.add(next);
                rels.add(r);
                dfs(plan, row, step + 1, next, nodes, rels, used, out);
                rels.remove(rels.size() - 1);
                nodes.remove(nodes.size() - 1);
                used.remove(Values.idKey(r.id()));
            }
            return;
        }
        long min = rel.length().get().min().orElse(1L);
        long max = rel.length().get().max().orElse(Long.MAX_VALUE);
        varHops(plan, row, step, cur, nodes, rels, used, out, new ArrayList<>(), min, max, target, targetVar);
    }

    private void varHops(PartPlan plan, Row row, int step, NodeValue cur, List<NodeValue> nodes, List<Object> rels,
                         Set<Object> used, List<Row> out, List<RelValue> segment, long min, long max,
                         Pattern.NodePattern target, String targetVar) {
        control.check();
        if (segment.size() >= min && nodeOk(target, targetVar, cur, row)) {
            nodes.add(cur);
            rels.add(Collections.unmodifiableList(new ArrayList<>(segment)));
            dfs(plan, row, step + 1, cur, nodes, rels, used, out);
            rels.remove(rels.size() - 1);
            nodes.remove(nodes.size() - 1);
        }
        if (segment.size() >= max) return;
        for (Object[] hop : hops(cur, plan.rels().get(step))) {
            RelValue r = (RelValue) hop[0];
            Object key = Values.idKey(r.id());
            if (used.contains(key)) continue;
            used.add(key);
            segment.add(r);
            varHops(plan, row, step, (NodeValue) hop[1], nodes, rels, used, out, segment, min, max, target, targetVar);
            segment.remove(segment.size() - 1);
            used.remove(key);
        }
    }

    private boolean nodeOk(Pattern.NodePattern p, String var, NodeValue n, Row row) {
        if (row.has(var) && !n.equals(row.get(var))) return false;
        return nodeMatches(p, n);
    }

    /** One hop from a vertex: (relationship, neighbour) pairs, cached for the run. */
    private List<Object[]> hops(NodeValue from, Pattern.RelPattern rel) {
        String[] types = edgeLabels(rel);
        if (types == null) return List.of();
        String key = Values.idKey(from.id()) + "|" + rel.direction() + "|" + String.join(",", types);
        List<Object[]> cached = hopCache.get(key);
        if (cached != null) return cached;
        GraphTraversal<Vertex, Vertex> t = port.g().V(from.id());
        GraphTraversal<Vertex, org.apache.tinkerpop.gremlin.structure.Edge> e = switch (rel.direction()) {
            case OUTGOING -> t.outE(types);
            case INCOMING -> t.inE(types);
            case BOTH -> t.bothE(types);
        };
        e.as("r");
        GraphTraversal<Vertex, Vertex> v = switch (rel.direction()) {
            case OUTGOING -> e.inV();
            case INCOMING -> e.outV();
            case BOTH -> e.otherV();
        };
        GraphTraversal<Vertex, Map<String, Object>> sel = v.as("m").select("r", "m").by(__.elementMap());
        List<Object[]> out = new ArrayList<>();
        Set<Object> seen = new HashSet<>();
        try {
            while (sel.hasNext()) {
                control.check();
                Map<String, Object> m = sel.next();
                RelValue r = GraphPort.rel(m.get("r"));
                if (rel.direction() == Pattern.Direction.BOTH && !seen.add(Values.idKey(r.id()))) continue;
                out.add(new Object[] {r, GraphPort.node(m.get("m"))});
            }
        } finally {
            closeQuietly(sel);
        }
        if (hopCache.size() < 100_000) hopCache.put(key, out);
        return out;
    }

    // ---------------------------------------------------------------- shortestPath / allShortestPaths

    /**
     * {@code shortestPath((a)-[*]-(b))}: for each start and each end node the pattern allows, one path of the
     * fewest relationships ({@code allShortestPaths}: every such path). A breadth-first search from each start,
     * hop by hop with the same lambda-free hop traversals as variable-length expansion, so the search stops at
     * the first level that reaches a bound end. The relationship's type, direction and properties restrict the
     * search itself; conditions of WHERE are applied to the paths found (as for any MATCH).
     */
    private List<Row> shortestPaths(PartPlan plan, Row row, List<Pushdown> pushed) {
        if (plan.rels().size() != 1) {
            throw EngineException.runtime("shortestPath and allShortestPaths need a pattern of exactly one relationship");
        }
        Pattern.RelPattern rel = plan.rels().get(0);
        long min = rel.length().flatMap(Pattern.Length::min).orElse(1L);
        long max = rel.length().isEmpty() ? 1 : rel.length().get().max().orElse(Long.MAX_VALUE);
        if (min > 1) throw EngineException.runtime("shortestPath and allShortestPaths take a minimum length of 0 or 1");
        boolean all = plan.kind() == Pattern.PathKind.ALL_SHORTEST;
        Pattern.NodePattern target = plan.nodes().get(1);
        String targetVar = plan.nodeVars().get(1);
        List<Row> out = new ArrayList<>();
        for (NodeValue start : startNodes(plan, row, pushed)) {
            control.check();
            Map<Object, NodeValue> nodes = new HashMap<>();
            Map<Object, List<Object[]>> via = new HashMap<>(); // node key -> (relationship, previous node key)
            Object startKey = Values.idKey(start.id());
            nodes.put(startKey, start);
            via.put(startKey, List.of());
            List<Object> level = List.of(startKey);
            boolean endBound = row.has(targetVar);
            for (long depth = 0; !level.isEmpty(); depth++) {
                boolean reached = false;
                if (depth >= min) {
                    for (Object k : level) {
                        NodeValue end = nodes.get(k);
                        if (!nodeOk(target, targetVar, end, row)) continue;
                        reached = true;
                        for (List<RelValue> segment : chains(k, via, all)) {
                            Row b = bind(plan, row, List.of(start, end), List.of(
                                    rel.length().isEmpty() ? segment.get(0) : Collections.unmodifiableList(segment)));
                            if (b != null) out.add(b);
                            control.checkSize(out.size());
                        }
                    }
                }
                if (depth >= max || (reached && endBound)) break;
                level = nextLevel(level, nodes, via, rel, row);
            }
        }
        return out;
    }

    /** The nodes first reached one hop further, recording every shortest way to each of them. */
    private List<Object> nextLevel(List<Object> level, Map<Object, NodeValue> nodes, Map<Object, List<Object[]>> via,
                                   Pattern.RelPattern rel, Row row) {
        Map<Object, List<Object[]>> found = new LinkedHashMap<>();
        for (Object k : level) {
            for (Object[] hop : hops(nodes.get(k), rel)) {
                control.check();
                RelValue r = (RelValue) hop[0];
                NodeValue next = (NodeValue) hop[1];
                Object nk = Values.idKey(next.id());
                if (via.containsKey(nk)) continue;
                if (rel.properties().isPresent() && !propsMatch(rel.properties().get(), r, row)) continue;
                nodes.putIfAbsent(nk, next);
                found.computeIfAbsent(nk, x -> new ArrayList<>()).add(new Object[] {r, k});
            }
        }
        via.putAll(found);
        return new ArrayList<>(found.keySet());
    }

    /** The relationship sequences of the shortest ways from the start to {@code key}: one, or all of them. */
    private List<List<RelValue>> chains(Object key, Map<Object, List<Object[]>> via, boolean all) {
        List<Object[]> ways = via.get(key);
        if (ways.isEmpty()) return List.of(new ArrayList<>());
        List<List<RelValue>> out = new ArrayList<>();
        for (Object[] way : all ? ways : ways.subList(0, 1)) {
            for (List<RelValue> prefix : chains(way[1], via, all)) {
                control.check();
                List<RelValue> chain = new ArrayList<>(prefix);
                chain.add((RelValue) way[0]);
                out.add(chain);
            }
        }
        return out;
    }

    NodeValue nodeById(Object id) {
        GraphTraversal<Vertex, Map<Object, Object>> t = port.g().V(id).elementMap();
        try {
            if (!t.hasNext()) throw EngineException.runtime("node " + id + " no longer exists");
            return GraphPort.node(t.next());
        } finally {
            closeQuietly(t);
        }
    }
}
