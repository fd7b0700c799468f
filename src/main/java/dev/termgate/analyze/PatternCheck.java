package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Quote;
import dev.termgate.query.LabelExpr;
import dev.termgate.query.Node;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * Classes against the ontology: infers the classes each node may be (from its labels, then narrowed by the
 * domains and ranges of the relationships it takes part in, subclasses, sub-properties, inverses and symmetry
 * included) and reports a relationship written against its direction, one that cannot connect its endpoint
 * classes, a label conjunction no class satisfies, a pattern whose constraints together leave a node no
 * possible class, and a property key used on a node whose classes cannot carry it.
 */
final class PatternCheck implements Check {

    @Override
    public boolean needsSchema() {
        return true;
    }

    /** One hop of a path pattern, with the bindings at its two ends. */
    private record Edge(Context.PatternUse use, Pattern.RelPattern rel, Binding from, Binding to,
                        Pattern.NodePattern fromNode, Pattern.NodePattern toNode, List<LabelExpr.Name> types,
                        boolean singleHop) {}

    @Override
    public void run(Query query, Context cx) {
        new Run(cx).run();
    }

    private static final class Run {
        final Context cx;
        final SchemaIndex ix;
        final Map<Binding, Cand> base = new IdentityHashMap<>();
        final Map<Binding, Pattern.NodePattern> labelled = new IdentityHashMap<>();

        Run(Context cx) {
            this.cx = cx;
            this.ix = cx.index;
        }

        void run() {
            Set<Binding> seen = Collections.newSetFromMap(new IdentityHashMap<>());
            for (Context.PatternUse use : cx.patterns) {
                for (Pattern.NodePattern np : use.part().nodes()) {
                    Binding b = cx.binding(np);
                    if (b == null) continue;
                    boolean first = seen.add(b);
                    if (!use.mandatory() && !first) continue;
                    Cand c = np.labels().map(this::labels).orElse(Cand.ANY);
                    Cand old = base.getOrDefault(b, Cand.ANY);
                    Cand now = old.and(c);
                    if (now.empty() && !old.empty() && !c.empty() && labelled.containsKey(b)) {
                        List<String> names = new ArrayList<>(written(labelled.get(b)));
                        names.addAll(written(np));
                        cx.report(Diagnostic.of(Code.IMPOSSIBLE_LABELS, np, Quote.andList(names)));
                        continue;
                    }
                    base.put(b, now);
                    if (np.labels().isPresent()) labelled.putIfAbsent(b, np);
                }
            }
            List<Edge> edges = edges();
            List<Edge> good = new ArrayList<>();
            for (Edge e : edges) {
                if (local(e)) good.add(e);
            }
            Map<Binding, Cand> solved = new IdentityHashMap<>(base);
            List<Edge> mandatory = good.stream().filter(e -> e.use().mandatory() && e.singleHop()).toList();
            final Map<Binding, Cand> state = solve(mandatory, solved, mandatory) ? solved : new IdentityHashMap<>(base);
            for (Context.PatternUse use : cx.patterns) {
                if (use.mandatory()) continue;
                List<Edge> optional = good.stream().filter(e -> e.use() == use && e.singleHop()).toList();
                if (optional.isEmpty()) continue;
                Map<Binding, Cand> trial = new IdentityHashMap<>(state);
                if (solve(optional, trial, optional)) {
                    // Bindings first seen in this part keep what the part implies, for the property check.
                    trial.forEach((b, c) -> {
                        if (!state.containsKey(b)) state.put(b, c);
                    });
                }
            }
            properties(state);
        }

        // ---- labels ----

        private Cand labels(LabelExpr l) {
            if (l instanceof LabelExpr.Name n) return ix.classesOf(n.name());
            if (l instanceof LabelExpr.And a) {
                Cand c = Cand.ANY;
                for (LabelExpr op : a.operands()) c = c.and(labels(op));
                if (c.empty() && a.operands().stream().allMatch(o -> o instanceof LabelExpr.Name)) {
                    impossible(a);
                    return Cand.ANY;
                }
                return c;
            }
            if (l instanceof LabelExpr.Or o) {
                Cand c = Cand.NONE;
                for (LabelExpr op : o.operands()) c = c.or(labels(op));
                return c;
            }
            return Cand.ANY;
        }

        /** A conjunction no class satisfies: each label could be dropped; repair tries which one alone helps. */
        private void impossible(LabelExpr.And a) {
            List<String> names = a.operands().stream().map(o -> ((LabelExpr.Name) o).name()).toList();
            List<Candidate> drops = new ArrayList<>();
            for (int i = 0; i < names.size(); i++) {
                List<LabelExpr> rest = new ArrayList<>(a.operands());
                rest.remove(i);
                String dropped = names.get(i);
                LabelExpr kept = rest.size() == 1 ? rest.get(0) : new LabelExpr.And(rest, a.span());
                drops.add(new Candidate(FixKind.DROP_LABEL, a, n -> kept, ":" + String.join(":", names),
                        ":" + String.join(":", names.stream().filter(x -> !x.equals(dropped)).toList()),
                        "no class is both " + Quote.andList(names) + "; without '" + dropped + "' the pattern can match",
                        0.5));
            }
            cx.report(Diagnostic.of(Code.IMPOSSIBLE_LABELS, a, Quote.andList(names)), drops);
        }

        private static List<String> written(Pattern.NodePattern np) {
            return np.labels().map(l -> dev.termgate.query.Trees.find(l, LabelExpr.Name.class).stream()
                    .map(LabelExpr.Name::name).toList()).orElse(List.of());
        }

        // ---- edges ----

        private List<Edge> edges() {
            List<Edge> out = new ArrayList<>();
            for (Context.PatternUse use : cx.patterns) {
                List<Pattern.NodePattern> nodes = use.part().nodes();
                for (int i = 0; i < use.part().steps().size(); i++) {
                    Pattern.RelPattern rel = use.part().steps().get(i).rel();
                    List<LabelExpr.Name> types = knownTypes(rel);
                    if (types.isEmpty()) continue;
                    Pattern.NodePattern a = nodes.get(i), b = nodes.get(i + 1);
                    Binding ba = cx.binding(a), bb = cx.binding(b);
                    if (ba == null || bb == null) continue;
                    boolean zero = rel.length().flatMap(Pattern.Length::min).map(m -> m == 0).orElse(false);
                    if (zero) continue;
                    out.add(new Edge(use, rel, ba, bb, a, b, types, rel.length().isEmpty()));
                }
            }
            return out;
        }

        /** The defined types of a relationship pattern; empty when it has none or any of them is not a name. */
        private List<LabelExpr.Name> knownTypes(Pattern.RelPattern rel) {
            if (rel.types().isEmpty()) return List.of();
            LabelExpr t = rel.types().get();
            List<LabelExpr.Name> names = new ArrayList<>();
            if (t instanceof LabelExpr.Name n) names.add(n);
            else if (t instanceof LabelExpr.Or o) {
                for (LabelExpr op : o.operands()) {
                    if (!(op instanceof LabelExpr.Name n)) return List.of();
                    names.add(n);
                }
            } else return List.of();
            // An unknown type is reported by TermCheck; with it the edge says nothing certain.
            for (LabelExpr.Name n : names) if (!cx.schema.relTypes().containsKey(n.name())) return List.of();
            return names;
        }

        /** Checks one hop against the labels alone; reports and returns false when it cannot match. */
        private boolean local(Edge e) {
            Cand from = base.getOrDefault(e.from(), Cand.ANY), to = base.getOrDefault(e.to(), Cand.ANY);
            Pattern.Direction dir = e.rel().direction();
            SchemaIndex.Pair hit = firstPair(e, from, to, dir);
            if (hit != null) {
                for (LabelExpr.Name n : e.types()) {
                    SchemaIndex.Pair p = firstPair(List.of(n), from, to, dir);
                    cx.use(TermKind.RELATIONSHIP, n.name(), n.span(), p == null ? TermUse.Via.DIRECT : p.via());
                }
                return true;
            }
            SchemaIndex.Pair reverse = dir == Pattern.Direction.BOTH ? null : firstPair(e, from, to, flip(dir));
            if (reverse != null) {
                wrongDirection(e, reverse, from, to);
            } else {
                cx.report(Diagnostic.of(Code.ENDPOINTS_NOT_ALLOWED, e.rel(), plainTypeNames(e),
                        describe(dir == Pattern.Direction.INCOMING ? e.toNode() : e.fromNode(),
                                dir == Pattern.Direction.INCOMING ? e.to() : e.from(),
                                dir == Pattern.Direction.INCOMING ? to : from),
                        describe(dir == Pattern.Direction.INCOMING ? e.fromNode() : e.toNode(),
                                dir == Pattern.Direction.INCOMING ? e.from() : e.to(),
                                dir == Pattern.Direction.INCOMING ? from : to)));
            }
            return false;
        }

        /**
         * Reports a relationship written against its direction. {@code declared} is the ontology's way round that
         * the reversed hop matches, when one does: the message names its classes; without one (the whole pattern,
         * not the hop alone, needs the reversal) the query's own nodes are named.
         */
        private void wrongDirection(Edge e, SchemaIndex.Pair declared, Cand from, Cand to) {
            String start = declared != null && declared.fromName() != null ? Quote.name(declared.fromName())
                    : describe(e.toNode(), e.to(), to);
            String end = declared != null && declared.toName() != null ? Quote.name(declared.toName())
                    : describe(e.fromNode(), e.from(), from);
            Pattern.RelPattern r = e.rel();
            List<Candidate> fixes = new ArrayList<>();
            String arrow = r.direction() == Pattern.Direction.OUTGOING ? "-->" : "<--";
            String back = r.direction() == Pattern.Direction.OUTGOING ? "<--" : "-->";
            fixes.add(new Candidate(FixKind.FLIP_DIRECTION, r, n -> flipped((Pattern.RelPattern) n), arrow, back,
                    "'" + plainTypeNames(e) + "' goes from " + start + " to " + end, 1.0));
            if (e.types().size() == 1) {
                cx.schema.relType(e.types().get(0).name()).flatMap(t -> t.inverseOf()).ifPresent(inv -> {
                    if (cx.schema.relTypes().containsKey(inv)
                            && firstPair(List.of(new LabelExpr.Name(inv, e.types().get(0).span())), from, to, r.direction()) != null) {
                        LabelExpr.Name old = e.types().get(0);
                        fixes.add(new Candidate(FixKind.USE_INVERSE, old, n -> new LabelExpr.Name(inv, n.span()),
                                old.name(), inv, "'" + inv + "' is the inverse of '" + old.name() + "'", 0.8));
                    }
                });
            }
            cx.report(Diagnostic.of(Code.WRONG_DIRECTION, r, plainTypeNames(e), start, end), fixes);
        }

        private static Pattern.RelPattern flipped(Pattern.RelPattern r) {
            return new Pattern.RelPattern(flip(r.direction()), r.variable(), r.types(), r.length(), r.properties(), r.span());
        }

        private static Pattern.Direction flip(Pattern.Direction d) {
            return switch (d) {
                case OUTGOING -> Pattern.Direction.INCOMING;
                case INCOMING -> Pattern.Direction.OUTGOING;
                case BOTH -> Pattern.Direction.BOTH;
            };
        }

        private SchemaIndex.Pair firstPair(Edge e, Cand from, Cand to, Pattern.Direction dir) {
            return firstPair(e.types(), from, to, dir);
        }

        private SchemaIndex.Pair firstPair(List<LabelExpr.Name> types, Cand from, Cand to, Pattern.Direction dir) {
            for (LabelExpr.Name t : types) {
                for (SchemaIndex.Pair p : ix.pairsOf(t.name())) {
                    if (dir != Pattern.Direction.INCOMING && p.from().intersects(from) && p.to().intersects(to)) return p;
                    if (dir != Pattern.Direction.OUTGOING && p.to().intersects(from) && p.from().intersects(to)) return p;
                }
            }
            return null;
        }

        // ---- propagation ----

        /**
         * Narrows the classes of every binding over the edges until nothing changes. When some binding is left
         * with no class, tries reversing each edge alone: if exactly one reversal makes the whole satisfiable, that
         * relationship is reported as written the wrong way round; otherwise the pattern as unsatisfiable.
         */
        private boolean solve(List<Edge> edges, Map<Binding, Cand> state, List<Edge> flippable) {
            if (edges.isEmpty()) return true;
            Map<Binding, Cand> start = new IdentityHashMap<>(state);
            Binding emptied = propagate(edges, state, null);
            if (emptied == null) return true;
            List<Edge> rescuers = new ArrayList<>();
            for (Edge f : flippable) {
                if (f.rel().direction() == Pattern.Direction.BOTH) continue;
                if (propagate(edges, new IdentityHashMap<>(start), f) == null) rescuers.add(f);
            }
            if (rescuers.size() == 1) {
                Edge e = rescuers.get(0);
                Cand from = start.getOrDefault(e.from(), Cand.ANY), to = start.getOrDefault(e.to(), Cand.ANY);
                wrongDirection(e, firstPair(e, from, to, flip(e.rel().direction())), from, to);
            } else {
                Edge at = edges.stream().filter(e -> e.from() == emptied || e.to() == emptied).findFirst().orElse(edges.get(0));
                String what = emptied.anonymous() ? "the unnamed node in this pattern" : "'" + emptied.name + "'";
                cx.report(Diagnostic.of(Code.UNSATISFIABLE_PATTERN, at.use().part(), what));
            }
            return false;
        }

        /** Returns the first binding left with no class, or null. {@code flipped} is read the other way round. */
        private Binding propagate(List<Edge> edges, Map<Binding, Cand> state, Edge flipped) {
            boolean changed = true;
            for (int round = 0; changed && round < 32; round++) {
                changed = false;
                for (Edge e : edges) {
                    Pattern.Direction dir = e == flipped ? flip(e.rel().direction()) : e.rel().direction();
                    Cand cu = state.getOrDefault(e.from(), Cand.ANY), cv = state.getOrDefault(e.to(), Cand.ANY);
                    Cand nu = Cand.NONE, nv = Cand.NONE;
                    for (LabelExpr.Name t : e.types()) {
                        for (SchemaIndex.Pair p : ix.pairsOf(t.name())) {
                            if (dir != Pattern.Direction.INCOMING && p.from().intersects(cu) && p.to().intersects(cv)) {
                                nu = nu.or(p.from().and(cu));
                                nv = nv.or(p.to().and(cv));
                            }
                            if (dir != Pattern.Direction.OUTGOING && p.to().intersects(cu) && p.from().intersects(cv)) {
                                nu = nu.or(p.to().and(cu));
                                nv = nv.or(p.from().and(cv));
                            }
                        }
                    }
                    if (nu.empty()) return e.from();
                    if (nv.empty()) return e.to();
                    if (!nu.sameAs(cu)) {
                        state.put(e.from(), nu);
                        changed = true;
                    }
                    if (!nv.sameAs(state.getOrDefault(e.to(), Cand.ANY))) {
                        state.put(e.to(), nv.and(state.getOrDefault(e.to(), Cand.ANY)));
                        changed = true;
                    }
                }
            }
            return null;
        }

        // ---- properties ----

        private void properties(Map<Binding, Cand> state) {
            for (Context.PropertyUse use : cx.properties) {
                if (use.target().type != Type.NODE) continue;
                Optional<PropertyKey> key = cx.schema.property(use.key());
                if (key.isEmpty() || key.get().anyDomain()) continue;
                Cand classes = state.getOrDefault(use.target(), base.getOrDefault(use.target(), Cand.ANY));
                Cand carriers = ix.carriersOf(use.key());
                if (classes.intersects(carriers)) {
                    boolean direct = classes.any() || ix.holdsAny(classes, key.get().domains());
                    cx.use(TermKind.PROPERTY, use.key(), use.keySpan(), direct ? TermUse.Via.DIRECT : TermUse.Via.SUPERCLASS);
                    continue;
                }
                Pattern.NodePattern np = labelled.get(use.target());
                cx.report(Diagnostic.of(Code.PROPERTY_NOT_ON_LABEL, use.node(), use.key(),
                        describe(np, use.target(), classes)), alternatives(use, classes));
            }
        }

        /** Keys the node's classes do carry whose names contain the written key as a word, shortest first. */
        private List<Candidate> alternatives(Context.PropertyUse use, Cand classes) {
            List<Candidate> out = new ArrayList<>();
            for (String other : ix.keysWithWord(use.key())) {
                if (other.equals(use.key()) || !classes.intersects(ix.carriersOf(other))) continue;
                out.add(new Candidate(FixKind.REPLACE_PROPERTY, use.node(), n -> TermCheck.rename(n, other), use.key(),
                        other, "'" + other + "' is defined for these classes", 0.5));
                if (out.size() == TermCheck.MAX_SUGGESTIONS) break;
            }
            return out;
        }

        // ---- wording ----

        private String describe(Pattern.NodePattern np, Binding b, Cand c) {
            if (np != null && np.labels().isPresent()) {
                return Quote.andList(written(np));
            }
            Pattern.NodePattern l = labelled.get(b);
            if (l != null) return Quote.andList(written(l));
            if (!c.any() && !c.empty() && c.size() <= 3) {
                return (b.anonymous() ? "a node" : "'" + b.name + "'") + " (" + Quote.orList(new ArrayList<>(new TreeSet<>(c.classes()))) + ")";
            }
            return b.anonymous() ? "a node" : "'" + b.name + "'";
        }

        /** {@code A|B}: the message template quotes it. */
        private static String plainTypeNames(Edge e) {
            return String.join("|", e.types().stream().map(LabelExpr.Name::name).toList());
        }
    }
}
