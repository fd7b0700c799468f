package dev.termgate.engine;

import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.Pattern;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Trees;
import org.apache.tinkerpop.gremlin.process.traversal.GType;
import org.apache.tinkerpop.gremlin.process.traversal.Order;
import org.apache.tinkerpop.gremlin.process.traversal.P;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.GraphTraversal;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.__;
import org.apache.tinkerpop.gremlin.structure.Column;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Sends the projection that follows a query's first MATCH to the graph with the match itself: grouping, the
 * standard aggregates, DISTINCT and (when the sort keys are exact in Gremlin) ORDER BY, SKIP and LIMIT become
 * steps of the one lambda-free traversal, so that {@code MATCH (v:Vessel) RETURN count(v)} brings back one
 * number instead of every vessel.
 *
 * <p>The pushed result must equal the client's to the bit, so the planner accepts only what it can prove:
 * <ul>
 * <li>the input is the single empty row, and the query starts {@code MATCH} (not OPTIONAL; one fixed-length,
 *     plain pattern part) with a WHERE whose every conjunct the traversal filters exactly (today's Matcher
 *     pushdowns are a superset filter re-checked on the client, impossible once rows are aggregated), followed
 *     by the projecting RETURN or WITH;</li>
 * <li>the items are pattern variables, {@code var.key}, and whole aggregate calls: count(*), count(x),
 *     count(DISTINCT x), sum/avg/min/max of {@code var.key}, collect of {@code var.key} or a variable.</li>
 * </ul>
 * Where Gremlin's value semantics differ from openCypher's the traversal returns exact partial results and
 * the client finishes them, or it checks the values and the client path answers: grouping and DISTINCT
 * compare 1 and 1.0 as different (so two groups that openCypher would make one send the query to the client
 * path; under a pushed LIMIT, where the client cannot see every group, any integral-float key does); {@code sum()} adds floats
 * left to right and {@code min()} turns mixed numbers into doubles (so integers are summed in the traversal,
 * floats come back as value/multiplicity pairs and are summed exactly, and min/max are taken per type);
 * {@code order()} ranks types and null differently (so sort keys carry openCypher's null and type rank
 * first). Any value the planner cannot vouch for (a list-valued key, a string in a sum, an integer overflow)
 * sends the whole query back to the client path, which gives the openCypher answer or error.
 */
final class ProjectionPushdown {
    /** Off only in the differential test, which compares pushed results with client-only ones. */
    static volatile boolean enabled = true;
    /** Runs answered by a pushed traversal (tests report how often the pushdown path is taken). */
    static final AtomicLong TAKEN = new AtomicLong();

    private static final GType[] INTEGRAL = {GType.LONG, GType.INT, GType.SHORT, GType.BYTE};
    private static final GType[] FLOATING = {GType.DOUBLE, GType.FLOAT};
    /** Numbers of a fixed-size Java type: the only ones the client's arithmetic sees. */
    private static final GType[] NUMERIC = {GType.LONG, GType.INT, GType.SHORT, GType.BYTE, GType.DOUBLE, GType.FLOAT};
    /** Values whose least and greatest the traversal finds per type. */
    private static final GType[] ORDERABLE = {GType.LONG, GType.INT, GType.SHORT, GType.BYTE, GType.DOUBLE, GType.FLOAT,
        GType.STRING, GType.BOOLEAN};

    /**
     * A filter passing values of any of the types. An or() of traversals, not of predicates: a remote server
     * (3.8.1, GraphBinary) was seen to drop the third operand of {@code P.typeOf(..).or(..).or(..)}.
     */
    @SuppressWarnings("rawtypes")
    private static GraphTraversal ofType(GType... types) {
        if (types.length == 1) return __.is(P.typeOf(types[0]));
        GraphTraversal[] alternatives = new GraphTraversal[types.length];
        for (int i = 0; i < types.length; i++) alternatives[i] = __.is(P.typeOf(types[i]));
        return __.or(alternatives);
    }

    private ProjectionPushdown() {}

    enum Kind { KEY, COUNT, COLLECT, SUM, AVG, MIN, MAX }

    /**
     * One projected column: a grouping key ({@code key} null for the element itself) or an aggregate of the
     * element at step label {@code label} (null: count rows).
     */
    record Col(String name, Kind kind, String label, String key, boolean distinct) {
        boolean relationship() {
            return label != null && label.startsWith("r");
        }

        /** True when the traversal computes the final value (so it may be sorted on there). */
        boolean exactInTraversal() {
            return kind == Kind.KEY ? key != null : kind == Kind.COUNT && !(distinct && key != null);
        }
    }

    /** A sort item on a projected column. */
    record Sort(int column, boolean descending) {}

    // ---------------------------------------------------------------- planning

    /** The pushed plan of the query's first two clauses, or null when they must run on the client. */
    static Planned plan(SingleQuery q, List<Row> input, Executor ex) {
        if (!enabled || input.size() != 1 || !input.get(0).names().isEmpty() || q.clauses().size() < 2) return null;
        if (!(q.clauses().get(0) instanceof Clause.Match m) || m.optional() || m.pattern().parts().size() != 1) return null;
        Clause.Projection p = q.clauses().get(1) instanceof Clause.Return r ? r.projection()
                : q.clauses().get(1) instanceof Clause.With w ? w.projection() : null;
        if (p == null || p.star()) return null;
        Pattern.Part part = m.pattern().parts().get(0);
        if (part.kind() != Pattern.PathKind.PLAIN || part.pathVariable().isPresent()) return null;
        for (Pattern.Step s : part.steps()) {
            if (s.rel().length().isPresent() || !exactProperties(s.rel().properties())) return null;
        }
        for (Pattern.NodePattern n : part.nodes()) if (!exactProperties(n.properties())) return null;
        List<Matcher.Pushdown> pushed = m.where().map(ex.matcher::pushdowns).orElse(List.of());
        Matcher.PartPlan plan = ex.matcher.plan(part, Row.EMPTY, pushed);
        Map<String, String> labels = new LinkedHashMap<>();
        for (int i = 0; i < plan.nodeVars().size(); i++) labels.putIfAbsent(plan.nodeVars().get(i), "n" + i);
        for (int i = 0; i < plan.relVars().size(); i++) labels.putIfAbsent(plan.relVars().get(i), "r" + i);
        if (m.where().isPresent() && !exactWhere(m.where().get(), labels.keySet())) return null;

        List<Executor.Item> items = ex.items(p, Set.of());
        List<Col> cols = new ArrayList<>();
        for (Executor.Item it : items) {
            Col c = column(it.name(), it.expr(), labels);
            if (c == null) return null;
            cols.add(c);
        }
        boolean aggregating = cols.stream().anyMatch(c -> c.kind() != Kind.KEY);
        List<Sort> sort = new ArrayList<>();
        for (Clause.SortItem s : p.orderBy()) {
            int c = sortColumn(s.expr(), items);
            if (c < 0) { sort = null; break; }
            sort.add(new Sort(c, s.descending()));
        }
        boolean cut = p.skip().isPresent() || p.limit().isPresent();
        boolean sortable = sort != null && sort.stream().allMatch(s -> cols.get(s.column()).exactInTraversal());
        // DISTINCT is a grouping with no aggregates. A plain projection brings back its values, not whole
        // elements; its ORDER BY may read only projected columns (the client then sorts the projected rows), and
        // with SKIP/LIMIT it must sort in the traversal, else the client needs every row anyway.
        boolean plain = !aggregating && !p.distinct();
        if (plain && (sort == null || cut && !sortable
                || q.clauses().get(1) instanceof Clause.With w && w.where().isPresent())) return null;
        boolean hasKeys = cols.stream().anyMatch(c -> c.kind() == Kind.KEY);
        // Sorting in the traversal pays only when SKIP or LIMIT then send fewer rows back.
        boolean orderPushed = hasKeys && sortable && cut
                && cols.stream().allMatch(c -> c.kind() == Kind.KEY || c.kind() == Kind.COUNT || c.kind() == Kind.COLLECT);
        long skip = 0, limit = -1;
        if (orderPushed) {
            try {
                skip = p.skip().map(e -> ex.count(e, "SKIP")).orElse(0L);
                limit = p.limit().map(e -> ex.count(e, "LIMIT")).orElse(-1L);
            } catch (RuntimeException e) {
                orderPushed = false; // the client path reports the bad SKIP or LIMIT
            }
        }
        return new Planned(ex.matcher, plan, pushed, cols, plain, orderPushed ? sort : null, skip, limit);
    }

    /** Inline property maps of literals: the traversal's has() steps then decide exactly as openCypher's =. */
    private static boolean exactProperties(Optional<Expr> props) {
        if (props.isEmpty()) return true;
        if (!(props.get() instanceof Expr.MapLit map)) return false;
        for (Expr.MapEntry e : map.entries()) if (!exactLiteral(e.value(), true)) return false;
        return true;
    }

    private static boolean exactLiteral(Expr e, boolean booleans) {
        return e instanceof Expr.StringLit || e instanceof Expr.IntegerLit
                || e instanceof Expr.FloatLit f && Double.isFinite(f.value())
                || booleans && e instanceof Expr.BooleanLit;
    }

    /**
     * WHERE conjuncts the traversal evaluates exactly as openCypher would keep rows: {@code var.key IS NOT NULL}
     * (stored properties are never null), comparisons of a property with a number or string literal, equality
     * with a boolean one (Gremlin's
     * comparability is false, as openCypher's null, across types and for NaN, and {@code neq} is true across
     * types like openCypher's {@code <>}), {@code IN} a list of such literals and the string predicates.
     */
    private static boolean exactWhere(Expr where, Set<String> vars) {
        for (Expr c : Matcher.conjuncts(where)) {
            Matcher.Pushdown p = Matcher.asPushdown(c);
            if (p == null || !vars.contains(p.var())) return false;
            if (p.notNull()) continue;
            boolean ok = switch (p.op()) {
                case EQ, NE -> exactLiteral(p.value(), true);
                case LT, GT, LE, GE -> exactLiteral(p.value(), false);
                case STARTS_WITH, ENDS_WITH, CONTAINS -> p.value() instanceof Expr.StringLit;
                case IN -> p.value() instanceof Expr.ListLit l && !l.elements().isEmpty()
                        && l.elements().stream().allMatch(x -> exactLiteral(x, false));
                default -> false;
            };
            if (!ok) return false;
        }
        return true;
    }

    private static Col column(String name, Expr e, Map<String, String> labels) {
        if (e instanceof Expr.Variable v) return labels.containsKey(v.name()) ? new Col(name, Kind.KEY, labels.get(v.name()), null, false) : null;
        if (e instanceof Expr.Property pr) {
            return pr.target() instanceof Expr.Variable v && labels.containsKey(v.name())
                    ? new Col(name, Kind.KEY, labels.get(v.name()), pr.key(), false) : null;
        }
        if (e instanceof Expr.CountStar) return new Col(name, Kind.COUNT, null, null, false);
        if (!(e instanceof Expr.FunctionCall f) || !f.namespace().isEmpty() || f.args().size() != 1) return null;
        Kind kind = switch (f.name().toLowerCase(Locale.ROOT)) {
            case "count" -> Kind.COUNT;
            case "collect" -> Kind.COLLECT;
            case "sum" -> Kind.SUM;
            case "avg" -> Kind.AVG;
            case "min" -> Kind.MIN;
            case "max" -> Kind.MAX;
            default -> null;
        };
        if (kind == null) return null;
        Expr arg = f.args().get(0);
        String label, key;
        if (arg instanceof Expr.Variable v && labels.containsKey(v.name())) {
            if (kind != Kind.COUNT && kind != Kind.COLLECT) return null; // sum(node) etc.: the client's error
            label = labels.get(v.name());
            key = null;
        } else if (arg instanceof Expr.Property pr && pr.target() instanceof Expr.Variable v && labels.containsKey(v.name())) {
            label = labels.get(v.name());
            key = pr.key();
        } else return null;
        boolean distinct = f.distinct();
        if (distinct && kind != Kind.COUNT && kind != Kind.COLLECT) {
            if (kind != Kind.MIN && kind != Kind.MAX) return null;
            distinct = false; // the least of the distinct values is the least value
        }
        // A bound variable is never null, so count(x) counts rows.
        if (kind == Kind.COUNT && key == null && !distinct) label = null;
        return new Col(name, kind, label, key, distinct);
    }

    /** The projected column a sort item reads (the item's expression repeated, or its alias); -1 if none. */
    private static int sortColumn(Expr e, List<Executor.Item> items) {
        for (int i = 0; i < items.size(); i++) {
            if (Trees.equalIgnoringSpans(items.get(i).expr(), e)) return i;
        }
        if (e instanceof Expr.Variable v) {
            for (int i = 0; i < items.size(); i++) if (items.get(i).name().equals(v.name())) return i;
        }
        return -1;
    }

    // ---------------------------------------------------------------- the pushed plan

    /** A projection the traversal computes; {@link #run} gives its rows, or null to use the client path. */
    static final class Planned {
        private final Matcher matcher;
        private final Matcher.PartPlan plan;
        private final List<Matcher.Pushdown> pushed;
        private final List<Col> cols;
        /** No aggregate and no DISTINCT: one output row per match. */
        private final boolean plain;
        private final List<Sort> sort;
        private final long skip;
        private final long limit;

        Planned(Matcher matcher, Matcher.PartPlan plan, List<Matcher.Pushdown> pushed, List<Col> cols, boolean plain,
                List<Sort> sort, long skip, long limit) {
            this.matcher = matcher;
            this.plan = plan;
            this.pushed = pushed;
            this.cols = List.copyOf(cols);
            this.plain = plain;
            this.sort = sort == null ? null : List.copyOf(sort);
            this.skip = skip;
            this.limit = limit;
        }

        /** True when ORDER BY, SKIP and LIMIT ran in the traversal too. */
        boolean orderPushed() {
            return sort != null;
        }

        /** True when some aggregate is finished on the client from the partial results. */
        boolean finishedOnClient() {
            return cols.stream().anyMatch(c -> c.kind() == Kind.SUM || c.kind() == Kind.AVG || c.kind() == Kind.MIN
                    || c.kind() == Kind.MAX || c.kind() == Kind.COUNT && c.distinct() && c.key() != null);
        }

        private boolean hasKeys() {
            return cols.stream().anyMatch(c -> c.kind() == Kind.KEY);
        }

        /** True when a grouping key is a property, whose values the traversal must vouch for per group. */
        private boolean keyChecks() {
            return cols.stream().anyMatch(c -> c.kind() == Kind.KEY && c.key() != null);
        }

        /**
         * The one aggregate when it is a count the traversal finishes: then each group reduces straight to it
         * (no rows are folded); -1 when there are other aggregates, or several.
         */
        private int singleCount() {
            int found = -1;
            for (int i = 0; i < cols.size(); i++) {
                Col c = cols.get(i);
                if (c.kind() == Kind.KEY) continue;
                if (found >= 0 || c.kind() != Kind.COUNT || c.distinct() && c.key() != null) return -1;
                found = i;
            }
            return found;
        }

        private boolean aggregating() {
            return cols.stream().anyMatch(c -> c.kind() != Kind.KEY);
        }

        @SuppressWarnings({"unchecked", "rawtypes"})
        GraphTraversal<?, ?> traversal(boolean explain) {
            GraphTraversal t = matcher.compileSteps(plan, Row.EMPTY, pushed, explain);
            if (t == null) return null;
            int k = plan.rels().size();
            if (plan.rels().stream().anyMatch(r -> r.direction() == Pattern.Direction.BOTH)) {
                // An undirected self-loop is walked both ways; the client keeps one row per set of elements.
                List<String> all = new ArrayList<>();
                for (int i = 0; i <= k; i++) all.add("n" + i);
                for (int i = 0; i < k; i++) all.add("r" + i);
                t = t.dedup(all.toArray(String[]::new));
            }
            if (plain) return plainRows(t);
            int single = singleCount();
            if (aggregating() && single < 0) {
                // fold() drops the path, so the elements the partial results read are first taken out of it.
                List<String> used = new ArrayList<>();
                for (Col c : cols) if (c.label() != null && !used.contains(c.label())) used.add(c.label());
                if (!used.isEmpty()) {
                    t = t.project(used.get(0), used.subList(1, used.size()).toArray(String[]::new));
                    for (String l : used) t = t.by(__.select(l));
                }
            }
            if (!hasKeys()) return single >= 0 ? count(t, cols.get(single)) : summary(t.fold());
            List<String> keys = keyNames();
            GraphTraversal groupKey = __.project(keys.get(0), keys.subList(1, keys.size()).toArray(String[]::new));
            for (Col c : cols) {
                if (c.kind() == Kind.KEY) groupKey = groupKey.by(c.key() == null ? __.select(c.label()) : __.select(c.label()).values(c.key()));
            }
            // With no aggregate (DISTINCT) the group's value is never read; count() keeps it small.
            GraphTraversal value = !aggregating() ? __.count() : single >= 0 ? count(__.start(), cols.get(single)) : summary(__.fold());
            // A missing property leaves its entry out of the key map: the group of null, read back as null.
            boolean rows = single >= 0 && cols.get(single).label() == null;
            t = rows ? t.groupCount().by(groupKey) : t.group().by(groupKey).by(value);
            boolean elementKeys = cols.stream().anyMatch(c -> c.kind() == Kind.KEY && c.key() == null);
            if (sort == null && !elementKeys) return t; // one map from key values to group values
            t = t.unfold();
            List<String> names = new ArrayList<>(keys);
            names.add("v");
            if (sort != null && keyChecks()) names.add("bad");
            t = t.project(names.get(0), names.subList(1, names.size()).toArray(String[]::new));
            List<GraphTraversal> checks = new ArrayList<>();
            int key = 0;
            for (Col c : cols) {
                if (c.kind() != Kind.KEY) continue;
                String kn = "k" + key++;
                t = t.by(c.key() == null ? __.select(Column.keys).select(kn).elementMap() : __.select(Column.keys).select(kn));
                if (c.key() != null && sort != null) checks.add(keyCheck(kn));
            }
            t = t.by(__.select(Column.values));
            if (sort == null) return t;
            if (checks.isEmpty()) return ordered(t);
            // Every group's key must pass the check, not only those of the rows LIMIT keeps.
            t = t.by(__.select(Column.keys).union(checks.toArray(GraphTraversal[]::new)).limit(1).count());
            return t.fold().project("bad", "rows")
                    .by(__.unfold().select("bad").is(P.gt(0L)).count())
                    .by(ordered(__.unfold()).fold());
        }

        /**
         * One row of projected values per match; with ORDER BY and SKIP/LIMIT, sorted and cut here. Rows whose
         * sort values Gremlin orders unlike openCypher (lists, temporals, numbers too large to compare exactly)
         * sort first, so that any of them is among the rows sent back and the client path takes over; SKIP is
         * then left to the client, after that check.
         */
        @SuppressWarnings({"unchecked", "rawtypes"})
        private GraphTraversal plainRows(GraphTraversal t) {
            boolean checks = sort != null && !sort.isEmpty();
            if (checks) {
                t = t.order().by(badSortValues(), Order.desc);
                for (Sort s : sort) t = sortKey(t, plainValue(cols.get(s.column())), s.descending());
                if (limit >= 0) t = t.limit(limit > Long.MAX_VALUE - skip ? Long.MAX_VALUE : skip + limit);
            } else if (sort != null) {
                t = limit >= 0 ? t.range(skip, limit > Long.MAX_VALUE - skip ? -1 : skip + limit) : t.skip(skip);
            }
            List<String> names = new ArrayList<>();
            for (int i = 0; i < cols.size(); i++) names.add("c" + i);
            if (checks) names.add("bad");
            t = t.project(names.get(0), names.subList(1, names.size()).toArray(String[]::new));
            for (Col c : cols) t = c.key() == null ? t.by(__.select(c.label()).elementMap()) : t.by(plainValue(c));
            return checks ? t.by(badSortValues()) : t;
        }

        /** 1 when a sort value of the row is one Gremlin would not order as openCypher does, else 0. */
        @SuppressWarnings("rawtypes")
        private GraphTraversal badSortValues() {
            List<GraphTraversal> checks = new ArrayList<>();
            for (Sort s : sort) checks.add(sortCheck(plainValue(cols.get(s.column()))));
            return __.union(checks.toArray(GraphTraversal[]::new)).limit(1).count();
        }

        @SuppressWarnings("rawtypes")
        private static GraphTraversal plainValue(Col c) {
            return __.select(c.label()).values(c.key());
        }

        /** Passes a sort value Gremlin would not order as openCypher does. */
        @SuppressWarnings("rawtypes")
        private static GraphTraversal sortCheck(GraphTraversal value) {
            return value.or(__.not(ofType(GType.NUMBER, GType.STRING, GType.BOOLEAN)),
                    ofType(GType.NUMBER).is(P.outside(-9.0e15, 9.0e15)));
        }

        /**
         * One ORDER BY key with openCypher's order: null after every value ascending (first descending), then
         * strings before booleans before numbers, then the values (one type by then, so Gremlin compares them as
         * openCypher does). {@code value} gives zero or one value.
         */
        @SuppressWarnings({"unchecked", "rawtypes"})
        private static GraphTraversal sortKey(GraphTraversal t, GraphTraversal value, boolean descending) {
            Order dir = descending ? Order.desc : Order.asc;
            GraphTraversal.Admin v = value.asAdmin();
            return t.by(v.clone().count(), descending ? Order.asc : Order.desc)
                    .by(__.coalesce(((GraphTraversal) v.clone()).choose(ofType(GType.STRING), __.constant(0),
                            __.choose(ofType(GType.BOOLEAN), __.constant(1), __.constant(2))), __.constant(-1)), dir)
                    .by(__.coalesce(v.clone(), __.constant(0)), dir);
        }

        private List<String> keyNames() {
            List<String> out = new ArrayList<>();
            for (Col c : cols) if (c.kind() == Kind.KEY) out.add("k" + out.size());
            return out;
        }

        /**
         * Groups are keyed by the stored values, which Gremlin compares with Java equality: exact for integers
         * (Long), non-integral doubles, strings and booleans, which is openCypher's equivalence on those. When
         * LIMIT keeps only some groups, the client cannot see whether two groups are one openCypher group (see
         * {@link #distinctGroups}), so an integral double (2.0, which openCypher groups with 2), a narrower
         * number type (Integer 2 beside Long 2) or a list, map or temporal key fails this check in the traversal
         * and the client path answers.
         */
        @SuppressWarnings("rawtypes")
        private static GraphTraversal keyCheck(String name) {
            return __.select(name).or(__.not(ofType(GType.LONG, GType.DOUBLE, GType.STRING, GType.BOOLEAN)),
                    ofType(GType.DOUBLE).math("_ - floor(_)").is(P.eq(0.0)));
        }

        /** A count the traversal finishes, appended to {@code t} (the rows, or one group's rows). */
        @SuppressWarnings({"unchecked", "rawtypes"})
        private static GraphTraversal count(GraphTraversal t, Col c) {
            if (c.label() == null) return t.count();
            t = t.select(c.label());
            if (c.key() != null) return t.values(c.key()).count();
            return c.distinct() ? t.dedup().count() : t.count();
        }

        /** Per group (or for all rows), from the folded rows: the aggregates' partial results and their checks. */
        @SuppressWarnings({"unchecked", "rawtypes"})
        private GraphTraversal summary(GraphTraversal folded) {
            List<String> names = new ArrayList<>();
            List<GraphTraversal> bys = new ArrayList<>();
            List<GraphTraversal> checks = new ArrayList<>();
            for (int i = 0; i < cols.size(); i++) {
                Col c = cols.get(i);
                GraphTraversal values = values(c);
                String a = "a" + i;
                switch (c.kind()) {
                    case KEY -> { }
                    case COUNT -> {
                        names.add(a);
                        if (values == null) bys.add(__.unfold().count());
                        else if (c.distinct() && c.key() != null) bys.add(values.dedup().fold());
                        else if (c.distinct()) bys.add(values.dedup().count());
                        else bys.add(values.count());
                    }
                    case COLLECT -> {
                        names.add(a);
                        GraphTraversal v = c.distinct() ? values.dedup() : values;
                        bys.add(c.key() == null ? v.elementMap().fold() : v.fold());
                    }
                    case SUM, AVG -> {
                        names.add(a + "i");
                        bys.add(values(c).filter(ofType(INTEGRAL)).sum().fold());
                        names.add(a + "f");
                        bys.add(values(c).filter(ofType(FLOATING)).groupCount());
                        names.add(a + "n");
                        bys.add(values.filter(ofType(NUMERIC)).count());
                        checks.add(__.select(c.label()).values(c.key()).not(ofType(NUMERIC)));
                    }
                    case MIN, MAX -> {
                        boolean min = c.kind() == Kind.MIN;
                        names.add(a + "i");
                        bys.add(extreme(values(c).filter(ofType(INTEGRAL)), min));
                        names.add(a + "f");
                        // order() ranks NaN above every number, as openCypher does; min() and max() skip it.
                        bys.add(values(c).filter(ofType(FLOATING)).order().by(min ? Order.asc : Order.desc).limit(1).fold());
                        names.add(a + "s");
                        bys.add(extreme(values(c).is(P.typeOf(GType.STRING)), min));
                        names.add(a + "b");
                        bys.add(extreme(values.is(P.typeOf(GType.BOOLEAN)), min));
                        checks.add(__.select(c.label()).values(c.key()).not(ofType(ORDERABLE)));
                    }
                }
            }
            if (!checks.isEmpty()) {
                names.add("bad");
                bys.add(__.unfold().union(checks.toArray(GraphTraversal[]::new)).limit(1).count());
            }
            GraphTraversal t = folded.project(names.get(0), names.subList(1, names.size()).toArray(String[]::new));
            for (GraphTraversal b : bys) t = t.by(b);
            return t;
        }

        /** A fresh traversal from the folded rows to the values a column aggregates (null: count rows). */
        @SuppressWarnings("rawtypes")
        private static GraphTraversal values(Col c) {
            if (c.label() == null) return null;
            return c.key() == null ? __.unfold().select(c.label()) : __.unfold().select(c.label()).values(c.key());
        }

        @SuppressWarnings("rawtypes")
        private static GraphTraversal extreme(GraphTraversal values, boolean min) {
            return (min ? values.min() : values.max()).fold();
        }

        /** ORDER BY over the groups (see {@link #sortKey}), then SKIP and LIMIT. */
        @SuppressWarnings({"unchecked", "rawtypes"})
        private GraphTraversal ordered(GraphTraversal t) {
            if (!sort.isEmpty()) {
                t = t.order();
                for (Sort s : sort) {
                    Col c = cols.get(s.column());
                    Order dir = s.descending() ? Order.desc : Order.asc;
                    if (c.kind() != Kind.KEY) {
                        t = t.by(singleCount() >= 0 ? __.select("v") : __.select("v").select("a" + s.column()), dir);
                        continue;
                    }
                    t = sortKey(t, __.select("k" + keyIndex(s.column())), s.descending());
                }
            }
            if (limit >= 0) return t.range(skip, limit > Long.MAX_VALUE - skip ? -1 : skip + limit);
            return skip > 0 ? t.skip(skip) : t;
        }

        private int keyIndex(int column) {
            int k = 0;
            for (int i = 0; i < column; i++) if (cols.get(i).kind() == Kind.KEY) k++;
            return k;
        }

        /** The projected rows (ordered and cut when {@link #orderPushed}), or null when the client must answer. */
        List<Row> run(RunControl control) {
            GraphTraversal<?, ?> t = traversal(false);
            if (t == null) return null;
            List<Object> results = new ArrayList<>();
            try {
                while (t.hasNext()) {
                    control.check();
                    results.add(t.next());
                    control.checkSize(results.size());
                }
            } catch (EngineException e) {
                throw e;
            } catch (RuntimeException e) {
                if (stopped(e, control)) throw e;
                return null; // a value Gremlin refused (integer overflow, a type it cannot order): the client decides
            } finally {
                Matcher.closeQuietly(t);
            }
            if (plain) return plainOut(results, control);
            if (sort != null && keyChecks()) {
                Map<?, ?> m = (Map<?, ?>) results.get(0);
                if (((Number) m.get("bad")).longValue() > 0) return null;
                results = new ArrayList<>((List<?>) m.get("rows"));
            }
            List<Row> out = new ArrayList<>(results.size());
            boolean groupMap = hasKeys() && sort == null && cols.stream().noneMatch(c -> c.kind() == Kind.KEY && c.key() == null);
            for (Object r : results) {
                if (groupMap) {
                    for (Map.Entry<?, ?> e : ((Map<?, ?>) r).entrySet()) {
                        control.check();
                        Row row = row((Map<?, ?>) e.getKey(), e.getValue());
                        if (row == null) return null;
                        out.add(row);
                        control.checkSize(out.size());
                    }
                    continue;
                }
                control.check();
                Row row = hasKeys() ? row((Map<?, ?>) r, ((Map<?, ?>) r).get("v")) : row(Map.of(), r);
                if (row == null) return null;
                out.add(row);
                control.checkSize(out.size());
            }
            if (sort == null && hasKeys() && !distinctGroups(out)) return null;
            TAKEN.incrementAndGet();
            return out;
        }

        /**
         * Gremlin groups by Java equality, openCypher by equivalence (2 and 2.0, Integer and Long 2, -0.0 and 0.0
         * are one group): with every group in hand, the client sees whether two of them are one openCypher group,
         * and then lets the client path answer. Which of 2 and 2.0 a merged group would show is the client
         * path's to decide, so the groups are not merged here.
         */
        private boolean distinctGroups(List<Row> rows) {
            Set<List<Object>> seen = new HashSet<>();
            for (Row r : rows) {
                List<Object> key = new ArrayList<>();
                for (Col c : cols) if (c.kind() == Kind.KEY) key.add(Values.groupKey(r.get(c.name())));
                if (!seen.add(key)) return false;
            }
            return true;
        }

        private List<Row> plainOut(List<Object> results, RunControl control) {
            List<Row> out = new ArrayList<>(results.size());
            for (Object r : results) {
                control.check();
                Map<?, ?> m = (Map<?, ?>) r;
                Object bad = m.get("bad");
                if (bad != null && ((Number) bad).longValue() > 0) return null;
                Map<String, Object> values = new LinkedHashMap<>();
                for (int i = 0; i < cols.size(); i++) {
                    Col c = cols.get(i);
                    values.put(c.name(), c.key() == null ? element(c, m.get("c" + i)) : Values.normalize(m.get("c" + i)));
                }
                out.add(Row.of(values));
                control.checkSize(out.size()); // the same bound on rows held as the client path's MATCH
            }
            boolean skipHere = sort != null && !sort.isEmpty();
            if (skipHere) out = new ArrayList<>(out.subList((int) Math.min(skip, out.size()), out.size()));
            TAKEN.incrementAndGet();
            return out;
        }

        private static boolean stopped(Throwable e, RunControl control) {
            if (control.expired() || Thread.currentThread().isInterrupted()) return true;
            for (Throwable c = e; c != null; c = c.getCause()) {
                if (c instanceof InterruptedException || c.getClass().getSimpleName().equals("TraversalInterruptedException")) return true;
            }
            return false;
        }

        /**
         * One output row from a group's key values ({@code k0..}, absent for null) and its value: the count
         * itself ({@link #singleCount}) or the map of partial results; null when a check failed.
         */
        private Row row(Map<?, ?> keys, Object value) {
            Object bad = keys.get("bad");
            if (bad != null && ((Number) bad).longValue() > 0) return null;
            int single = singleCount();
            Map<?, ?> m = single >= 0 || !aggregating() ? Map.of() : (Map<?, ?>) value;
            bad = m.get("bad");
            if (bad != null && ((Number) bad).longValue() > 0) return null;
            Map<String, Object> values = new LinkedHashMap<>();
            int key = 0;
            for (int i = 0; i < cols.size(); i++) {
                Col c = cols.get(i);
                String a = "a" + i;
                Object v;
                switch (c.kind()) {
                    case KEY -> {
                        Object k = keys.get("k" + key++);
                        v = c.key() == null ? element(c, k) : Values.normalize(k);
                    }
                    case COUNT -> v = i == single ? ((Number) value).longValue()
                            : c.distinct() && c.key() != null ? (long) distinct((List<?>) m.get(a)).size()
                            : ((Number) m.get(a)).longValue();
                    case COLLECT -> {
                        List<Object> l = new ArrayList<>();
                        for (Object o : (List<?>) m.get(a)) l.add(c.key() == null ? element(c, o) : Values.normalize(o));
                        v = Collections.unmodifiableList(c.distinct() ? distinct(l) : l);
                    }
                    case SUM, AVG -> {
                        Object ints = first(m.get(a + "i"));
                        Map<?, ?> floats = (Map<?, ?>) m.get(a + "f");
                        long n = ((Number) m.get(a + "n")).longValue();
                        if (c.kind() == Kind.AVG && n == 0) v = null;
                        else if (floats.isEmpty() && c.kind() == Kind.SUM) v = ints == null ? 0L : ints;
                        else {
                            // Rounded once from the exact sum, as Aggregation does, whatever order rows came in.
                            BigDecimal exact = ints == null ? BigDecimal.ZERO : BigDecimal.valueOf((Long) ints);
                            for (Map.Entry<?, ?> e : floats.entrySet()) {
                                double d = ((Number) e.getKey()).doubleValue();
                                if (!Double.isFinite(d)) return null; // the client sums these left to right
                                exact = exact.add(new BigDecimal(d).multiply(BigDecimal.valueOf(((Number) e.getValue()).longValue())));
                            }
                            v = c.kind() == Kind.SUM ? exact.doubleValue() : exact.doubleValue() / n;
                        }
                    }
                    case MIN, MAX -> {
                        Object best = null;
                        for (String part : List.of("i", "f", "s", "b")) {
                            Object x = first(m.get(a + part));
                            if (x == null) continue;
                            int cmp = best == null ? 0 : Values.orderCompare(x, best);
                            if (best == null || (c.kind() == Kind.MIN ? cmp < 0 : cmp > 0)) best = x;
                        }
                        v = best;
                    }
                    default -> throw new IllegalStateException(c.kind().name());
                }
                values.put(c.name(), v);
            }
            return Row.of(values);
        }

        private static Object element(Col c, Object elementMap) {
            return c.relationship() ? GraphPort.rel(elementMap) : GraphPort.node(elementMap);
        }

        /** The value of a folded zero-or-one list, normalized; null for the empty list. */
        private static Object first(Object folded) {
            List<?> l = (List<?>) folded;
            return l.isEmpty() ? null : Values.normalize(l.get(0));
        }

        /** Distinct under openCypher's equivalence (1 and 1.0 are one value), first occurrences in order. */
        private static List<Object> distinct(List<?> values) {
            Set<Object> seen = new HashSet<>();
            List<Object> out = new ArrayList<>();
            for (Object o : values) {
                Object v = Values.normalize(o);
                if (seen.add(Values.groupKey(v))) out.add(v);
            }
            return out;
        }
    }
}
