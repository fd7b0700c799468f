package dev.termgate.interpret;

import dev.termgate.link.InMemoryValueIndex;
import dev.termgate.link.ValueIndex;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.TermKind;
import dev.termgate.schema.ValueType;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The offline interpreter: turns a question into an openCypher read query with no model, in the manner of
 * ontology-driven natural-language interfaces to databases. Evidence (ontology terms named by the question's
 * words, instance values, numbers and periods, and cue words for counting, superlatives, grouping, comparison
 * and negation) is placed on the ontology's class graph; an interpretation tree connects it (a Steiner tree
 * grown by cheapest paths, cheaper through relationships the question names and through populated ones); the
 * tree and the cues decide the query's shape. When too little of the question is explained it declines.
 *
 * <p>Thread-safe once made: all state is per call.
 */
public final class Interpreter {

    /** Below this share of explained content words the question is declined (common practice: a third). */
    public static final double MIN_COVERAGE = 0.34;

    private final GraphSchema schema;
    private final DataProfile profile;
    private final Lexicon lexicon;
    /** Code-list values ("import", "scan"), matched in any case and number. */
    private final ValueFinder values;
    /** Names and codes of instances: the schema-linking value index. */
    private final ValueIndex names;
    private final SchemaGraph graph;

    private Interpreter(GraphSchema schema, DataProfile profile) {
        this.schema = schema;
        this.profile = profile;
        this.lexicon = Lexicon.of(schema);
        this.values = new ValueFinder(profile.values().stream().filter(DataProfile.Value::categorical).toList());
        this.names = nameIndex(profile);
        this.graph = new SchemaGraph(schema, profile);
    }

    /** The schema-linking value index over the profile's names and codes (code lists are matched apart). */
    static ValueIndex nameIndex(DataProfile profile) {
        InMemoryValueIndex.Builder b = ValueIndex.builder();
        for (DataProfile.Value v : profile.values()) if (!v.categorical()) b.add(v.value(), v.label(), v.key());
        return b.build();
    }

    public static Interpreter create(GraphSchema schema, DataProfile profile) {
        return new Interpreter(schema, profile);
    }

    public GraphSchema schema() {
        return schema;
    }

    public Interpretation interpret(String question) {
        return new Run(question).interpret();
    }

    // ---------------------------------------------------------------------------------------------------------

    private enum Agg { COUNT, SUM, AVG }

    /** The superlative and comparative words, with their direction and the words of the property they hint at. */
    private record Cue(int at, int words, boolean descending, List<String> hints) {}

    private static final Map<String, Cue> SUPERLATIVES = Map.ofEntries(
            Map.entry("most", new Cue(0, 1, true, List.of())),
            Map.entry("largest", new Cue(0, 1, true, List.of("size", "capac", "tonnag", "length"))),
            Map.entry("biggest", new Cue(0, 1, true, List.of("size", "capac", "tonnag"))),
            Map.entry("greatest", new Cue(0, 1, true, List.of())),
            Map.entry("highest", new Cue(0, 1, true, List.of())),
            Map.entry("heaviest", new Cue(0, 1, true, List.of("weight"))),
            Map.entry("longest", new Cue(0, 1, true, List.of("length"))),
            Map.entry("deepest", new Cue(0, 1, true, List.of("draught", "depth"))),
            Map.entry("newest", new Cue(0, 1, true, List.of("year", "built", "date"))),
            Map.entry("latest", new Cue(0, 1, true, List.of("date", "time"))),
            Map.entry("recent", new Cue(0, 1, true, List.of("date", "time"))),
            Map.entry("oldest", new Cue(0, 1, false, List.of("year", "built", "founded", "date"))),
            Map.entry("earliest", new Cue(0, 1, false, List.of("date", "time"))),
            Map.entry("least", new Cue(0, 1, false, List.of())),
            Map.entry("fewest", new Cue(0, 1, false, List.of())),
            Map.entry("smallest", new Cue(0, 1, false, List.of("size", "capac", "tonnag"))),
            Map.entry("lowest", new Cue(0, 1, false, List.of())),
            Map.entry("lightest", new Cue(0, 1, false, List.of("weight"))),
            Map.entry("shortest", new Cue(0, 1, false, List.of("length"))));

    /** Added to a tree's cost per pair the grammar joins but the tree does not (common practice: above any path). */
    private static final double LINK_PENALTY = 10;

    /** Phrases that ask to see the members of each group as well as their count (common practice wording). */
    private static final List<String[]> MEMBERS = List.of(new String[] {"which", "are", "they"}, new String[] {"what", "are", "they"},
            new String[] {"which", "ones"}, new String[] {"name", "them"}, new String[] {"list", "them"});

    private static final Set<String> NEGATIONS = Set.of("never", "no", "without", "none", "not");

    /** One node of the interpretation tree. */
    private static final class QNode {
        final int id;
        String label;
        final int pos;
        final boolean mention;
        boolean modifier;
        boolean negated;
        final List<String> values = new ArrayList<>();
        String valueKey;
        /** Set for nodes added for a relationship the question names ("declarations for", "called at"). */
        boolean fromRelationship;
        final List<String[]> conds = new ArrayList<>();
        String var;

        QNode(int id, String label, int pos, boolean mention) {
            this.id = id;
            this.label = label;
            this.pos = pos;
            this.mention = mention;
        }
    }

    /** One relationship of the tree; {@code hops} is a variable length such as {@code *1..2}, or empty. */
    private record PEdge(QNode a, String type, QNode b, boolean symmetric, String hops) {
        PEdge(QNode a, String type, QNode b, boolean symmetric) {
            this(a, type, b, symmetric, "");
        }
    }

    /**
     * A reading of "after …" along a relationship the ontology declares from a class to itself and labels as
     * succession ("next port call", "followed by"): the answer's event follows the named one by {@code hops}.
     */
    private record Succession(String type, int cueAt, String hops, Quantities.Quantity count) {}

    /** Words of a self-relationship's labels that say it leads to the following one (common practice). */
    private static final Set<String> SUCCESSION_WORDS = Set.of("next", "follow", "followed", "following", "successor", "subsequent");

    /** One question's interpretation; the fields are the working state. */
    private final class Run {
        final String question;
        final List<String> why = new ArrayList<>();
        final List<QNode> nodes = new ArrayList<>();
        final List<PEdge> edges = new ArrayList<>();
        final List<PEdge> negEdges = new ArrayList<>();
        Succession succession;
        /** Searches of the class graph already made for this question (the mentioned types do not change within it). */
        final Map<String, SchemaGraph.Path> paths = new HashMap<>();
        /** Node ids the question's grammar joins directly (see {@link #linkEvents}). */
        final Map<Integer, Set<Integer>> links = new HashMap<>();
        /** The classes of the question's own nodes: a path joining grammatical partners does not pass through them. */
        final Set<String> terminalClasses = new HashSet<>();
        Evidence ev;
        final List<ValueFinder.Hit> categorical = new ArrayList<>();
        List<Evidence.TermHit> readings;
        double pathCost;
        int nextId;

        Run(String question) {
            this.question = question;
        }

        Interpretation interpret() {
            ev = Evidence.of(question, lexicon, values, names);
            for (Evidence.TermHit h : ev.terms) {
                why.add(h.kind().name().toLowerCase(Locale.ROOT) + " " + h.name() + " ← \"" + span(h.from(), h.to()) + "\""
                        + String.format(Locale.ROOT, " (%.2f)", h.score()));
            }
            for (ValueFinder.Hit h : ev.values) {
                why.add("value " + h.value().label() + "." + h.value().key() + " = '" + h.value().value() + "'");
            }
            double coverage = coverage();
            int negAt = negationIndex();
            buildNodes(negAt);
            QNode focus = focus();
            if (focus == null) {
                return Interpretation.declined("no class or instance of the ontology is named", coverage * 0.5, why);
            }
            if (coverage < MIN_COVERAGE) {
                return Interpretation.declined(String.format(Locale.ROOT,
                        "only %.0f%% of the question's words match the ontology", coverage * 100), coverage, why);
            }
            succession = succession();
            Shape shape = shape(focus, negAt);
            if (shape.error != null) return Interpretation.declined(shape.error, coverage * 0.5, why);
            String unreached = connect(focus);
            if (unreached != null) {
                return Interpretation.declined("nothing in the ontology connects " + focus.label + " to " + unreached,
                        coverage * 0.5, why);
            }
            if (succession != null) follow(focus);
            String query = write(focus, shape);
            double confidence = coverage / (1 + 0.1 * Math.max(0, pathCost - edges.size() - negEdges.size()));
            why.add("tree: " + edges.size() + " relationship(s), cost " + String.format(Locale.ROOT, "%.2f", pathCost));
            return new Interpretation(Optional.of(query), shape.kind, Math.min(1, confidence), Optional.empty(), why);
        }

        /**
         * "After X", "following X": a self-relationship of succession, and how far: "within two calls" reads as
         * one to two steps, "all the way" as any number, otherwise one step ("right after", "next").
         */
        Succession succession() {
            int cue = -1;
            for (Words.Tok t : ev.toks) {
                if (t.lower().equals("after") || t.lower().startsWith("follow")) {
                    cue = t.index();
                    break;
                }
            }
            if (cue < 0) return null;
            String type = null;
            for (var r : schema.relTypes().values()) {
                List<List<String>> ends = ends(new Evidence.TermHit(TermKind.RELATIONSHIP, r.name(), 0, 0, 0, false));
                // Succession has a direction: a symmetric self-relationship ("next to") is adjacency instead.
                if (r.symmetric() || ends.get(0).size() != 1 || !ends.get(0).equals(ends.get(1))) continue;
                Set<String> words = new HashSet<>(Words.stems(String.join(" ", dev.termgate.schema.Names.words(r.name()))));
                r.info().labels().forEach(l -> words.addAll(Words.tokens(l.text()).stream().map(Words.Tok::lower).toList()));
                r.info().altLabels().forEach(l -> words.addAll(Words.tokens(l.text()).stream().map(Words.Tok::lower).toList()));
                if (words.stream().anyMatch(SUCCESSION_WORDS::contains)) {
                    type = r.name();
                    break;
                }
            }
            if (type == null) return null;
            int within = ev.indexOf("within");
            for (Quantities.Quantity q : ev.quantities) {
                if (within >= 0 && q.from() == within + 1 && !q.period() && q.value() >= 1) {
                    return new Succession(type, cue, "*1.." + (int) q.value(), q);
                }
            }
            boolean open = ev.indexOfPhrase("all", "the", "way") >= 0 || ev.indexOfPhrase("to", "the", "end") >= 0;
            return new Succession(type, cue, open ? "*" : "", null);
        }

        /**
         * Splits the event node between the answer and the thing named after the cue into two events, the
         * answer's following the named one along the succession relationship.
         */
        void follow(QNode focus) {
            String domain = ends(new Evidence.TermHit(TermKind.RELATIONSHIP, succession.type(), 0, 0, 0, false)).get(0).get(0);
            for (QNode anchor : nodes) {
                if (anchor == focus || anchor.negated || anchor.pos <= succession.cueAt()) continue;
                List<QNode> path = treePath(edges, focus, anchor);
                if (path == null) continue;
                for (int i = 1; i < path.size() - 1; i++) {
                    QNode e = path.get(i);
                    if (!schema.isSubLabel(e.label, domain)) continue;
                    QNode toward = path.get(i - 1);
                    QNode next = new QNode(nextId++, e.label, -1, false);
                    edges.replaceAll(x -> x.a() == e && x.b() == toward ? new PEdge(next, x.type(), toward, x.symmetric(), x.hops())
                            : x.b() == e && x.a() == toward ? new PEdge(toward, x.type(), next, x.symmetric(), x.hops()) : x);
                    edges.add(new PEdge(e, succession.type(), next, false, succession.hops()));
                    why.add("\"" + ev.toks.get(succession.cueAt()).raw() + "\": the answer's " + e.label + " follows by "
                            + succession.type() + succession.hops());
                    return;
                }
            }
        }

        String span(int from, int to) {
            return question.substring(ev.toks.get(from).start(), ev.toks.get(to - 1).end());
        }

        // ---- evidence to nodes ----

        double coverage() {
            boolean[] covered = new boolean[ev.toks.size()];
            for (Evidence.TermHit h : ev.terms) for (int i = h.from(); i < h.to(); i++) covered[i] = true;
            for (ValueFinder.Hit h : ev.values) for (int i = h.from(); i < h.to(); i++) covered[i] = true;
            for (Quantities.Quantity q : ev.quantities) for (int i = q.from(); i < q.to(); i++) covered[i] = true;
            int content = 0;
            int hit = 0;
            for (Words.Tok t : ev.toks) {
                boolean cue = SUPERLATIVES.containsKey(t.lower()) || t.lower().equals("average") || t.lower().equals("compare");
                if (Words.isStop(t) && !covered[t.index()]) continue;
                content++;
                if (covered[t.index()] || cue) hit++;
            }
            return content == 0 ? 0 : (double) hit / content;
        }

        int negationIndex() {
            for (Words.Tok t : ev.toks) {
                if (!NEGATIONS.contains(t.lower())) continue;
                boolean inValue = ev.values.stream().anyMatch(h -> t.index() >= h.from() && t.index() < h.to());
                boolean inTerm = ev.terms.stream().anyMatch(h -> t.index() >= h.from() && t.index() < h.to());
                // "no more than 3" is a comparison, not a negation.
                boolean comparison = t.index() + 1 < ev.toks.size() && Set.of("more", "less", "fewer", "later", "earlier")
                        .contains(ev.toks.get(t.index() + 1).lower());
                if (!inValue && !inTerm && !comparison) return t.index();
            }
            return -1;
        }

        void buildNodes(int negAt) {
            // Classes: one node per span, the strongest reading.
            Map<Integer, Double> bestAt = new HashMap<>();
            for (Evidence.TermHit h : ev.terms) bestAt.merge(h.from(), h.score(), Math::max);
            Map<Integer, Evidence.TermHit> byStart = new LinkedHashMap<>();
            for (Evidence.TermHit h : ev.bestOf(TermKind.LABEL)) {
                if (h.score() >= bestAt.get(h.from()) - 0.15) byStart.put(h.from(), h);
            }
            Set<String> seenLabels = new HashSet<>();
            for (Evidence.TermHit h : byStart.values()) {
                // "inspections … physical examinations": one class named twice is one thing.
                if (!seenLabels.add(h.name())) continue;
                QNode n = new QNode(nextId++, h.name(), h.from(), true);
                n.negated = negAt >= 0 && h.from() > negAt;
                nodes.add(n);
            }
            // Values: merged into an adjacent class node of a compatible class, else their own node.
            Map<Integer, List<ValueFinder.Hit>> valuesAt = new LinkedHashMap<>();
            for (ValueFinder.Hit h : ev.values) {
                // Values of code lists describe a node the question names otherwise; they are placed later.
                if (h.value().categorical()) categorical.add(h);
                else valuesAt.computeIfAbsent(h.from(), k -> new ArrayList<>()).add(h);
            }
            List<QNode> valueNodes = new ArrayList<>();
            for (List<ValueFinder.Hit> hits : valuesAt.values()) {
                ValueFinder.Hit chosen = hits.get(0);
                QNode into = null;
                for (ValueFinder.Hit h : hits) {
                    QNode adj = adjacentClass(h);
                    if (adj != null) {
                        chosen = h;
                        into = adj;
                        break;
                    }
                }
                if (into != null) {
                    if (schema.isSubLabel(chosen.value().label(), into.label)) into.label = chosen.value().label();
                    into.values.add(chosen.value().value());
                    into.valueKey = chosen.value().key();
                    why.add("value '" + chosen.value().value() + "' qualifies " + into.label);
                    continue;
                }
                QNode n = new QNode(nextId++, chosen.value().label(), chosen.from(), false);
                n.values.add(chosen.value().value());
                n.valueKey = chosen.value().key();
                n.negated = negAt >= 0 && chosen.from() > negAt;
                valueNodes.add(n);
            }
            // Several values of one key with no class named between them are alternatives: one node, IN list.
            List<QNode> merged = new ArrayList<>();
            for (QNode v : valueNodes) {
                QNode prev = merged.isEmpty() ? null : merged.get(merged.size() - 1);
                if (prev != null && prev.label.equals(v.label) && prev.valueKey.equals(v.valueKey) && !classBetween(prev.pos, v.pos)) {
                    prev.values.add(v.values.get(0));
                } else {
                    merged.add(v);
                }
            }
            nodes.addAll(merged);
            nodes.sort((a, b) -> Integer.compare(a.pos, b.pos));
            // In "customs inspection" or "tanker voyages" the first class only qualifies the second.
            for (int i = 0; i + 1 < nodes.size(); i++) {
                QNode a = nodes.get(i);
                QNode b = nodes.get(i + 1);
                // "carriers' ships", "country's flag": a possessor is what is asked about, not a qualifier.
                if (a.mention && b.mention && a.values.isEmpty() && endOf(a) == b.pos && !possessive(endOf(a) - 1)) a.modifier = true;
            }
            // A named relationship needs both its ends in the tree.
            for (Evidence.TermHit h : ev.bestOf(TermKind.RELATIONSHIP)) {
                if (h.score() < bestAt.get(h.from()) - 0.15) continue;
                // Of several readings of one verb ("originated": loaded at, origin country), one whose both ends
                // the question names already explains it; no other brings anything in.
                if (ev.termsOf(TermKind.RELATIONSHIP).stream().anyMatch(o -> o.from() == h.from() && o.score() >= h.score() - 0.05
                        && !present(ends(o)).contains(false))) continue;
                List<List<String>> ends = ends(h);
                if (ends.get(0).isEmpty() && ends.get(1).isEmpty()) continue;
                List<Boolean> present = present(ends);
                // A weak (partial) reading only counts when it attaches to something the question names and no
                // property reads the same word as well ("booked": booking date, booked by, booked on).
                if (h.partial() && !present.contains(true)) continue;
                if (h.partial() && ev.termsOf(TermKind.PROPERTY).stream().anyMatch(o -> o.from() == h.from() && o.score() >= h.score())) continue;
                for (int k = 0; k < 2; k++) {
                    if (present.get(k) || ends.get(k).isEmpty()) continue;
                    String end = ends.get(k).get(0);
                    QNode n = new QNode(nextId++, end, h.from(), false);
                    n.fromRelationship = true;
                    n.negated = negAt >= 0 && h.from() > negAt;
                    nodes.add(n);
                    why.add("relationship " + h.name() + " brings in " + end);
                }
            }
        }

        /** The classes a relationship type may start from and end at. */
        List<List<String>> ends(Evidence.TermHit h) {
            List<dev.termgate.schema.Endpoint> eps = schema.relType(h.name()).map(r -> r.endpoints()).orElse(List.of());
            return List.of(
                    eps.stream().map(dev.termgate.schema.Endpoint::from).filter(java.util.Objects::nonNull).distinct().toList(),
                    eps.stream().map(dev.termgate.schema.Endpoint::to).filter(java.util.Objects::nonNull).distinct().toList());
        }

        /** For each end, whether a node of the question may stand there. */
        List<Boolean> present(List<List<String>> ends) {
            return ends.stream().map(alts -> !alts.isEmpty() && alts.stream().anyMatch(end -> nodes.stream()
                    .anyMatch(n -> schema.isSubLabel(n.label, end) || schema.isSubLabel(end, n.label)))).toList();
        }

        /** Whether the token is followed by a possessive apostrophe in the question's text. */
        boolean possessive(int tok) {
            int end = ev.toks.get(tok).end();
            return end < question.length() && (question.charAt(end) == '\'' || question.charAt(end) == '\u2019');
        }

        /**
         * Pairs of nodes the question's grammar joins directly. A node a verb brings in (an event such as a port
         * call, named by "called at" or "visited") is joined to its subject, the node named just before the
         * verb, and to its object, the node named just after it ("ships called at Caddenby", "ports visited by
         * a tanker"), rather than each being joined wherever the class graph is shortest.
         */
        void linkEvents() {
            for (QNode e : List.copyOf(nodes)) {
                int[] verb = verbSpan(e);
                if (verb == null) continue;
                QNode subject = null;
                QNode object = null;
                for (QNode n : nodes) {
                    if (n == e || n.pos < 0) continue;
                    if (n.pos < verb[0] && onlyFunctionWords(endOf(n), verb[0], 4) && (subject == null || n.pos > subject.pos)) subject = n;
                    if (n.pos >= verb[1] && onlyFunctionWords(verb[1], n.pos, 3) && (object == null || n.pos < object.pos)) object = n;
                }
                if (subject != null) link(e, subject);
                if (object != null) link(e, object);
            }
            // "importers in Lumeria", "Norvane exporters": a name right beside a class of another kind belongs to it.
            for (QNode v : nodes) {
                if (v.mention || v.values.isEmpty() || v.pos < 0 || links.containsKey(v.id)) continue;
                QNode owner = null;
                for (QNode c : nodes) {
                    if (!c.mention || c.pos < 0) continue;
                    // The class right after the name first ("Norvane exporters"), then one a preposition before.
                    if (c.pos == endOf(v)) {
                        owner = c;
                        break;
                    }
                    if (c.pos < v.pos && endOf(c) < v.pos && onlyFunctionWords(endOf(c), v.pos, 1)) owner = c;
                }
                if (owner != null) link(owner, v);
            }
        }

        /** The tokens of the verb that brought in or names an event node, or null when none did. */
        int[] verbSpan(QNode n) {
            if (n.fromRelationship) {
                // A relationship read from words that bring in both its ends joins nothing the question named.
                if (nodes.stream().anyMatch(o -> o != n && o.fromRelationship && o.pos == n.pos)) return null;
                for (Evidence.TermHit h : ev.termsOf(TermKind.RELATIONSHIP)) {
                    if (h.from() == n.pos && !h.partial() && verbal(h)) return new int[] {h.from(), h.to()};
                }
                return null;
            }
            if (!n.mention || n.pos < 0) return null;
            String w = ev.toks.get(n.pos).lower();
            // A class named by a verb made from its noun ("visited", "berthed"); not an adjective ("containerised").
            boolean verb = w.endsWith("ed") && !w.endsWith("ised") && !w.endsWith("ized");
            return verb ? new int[] {n.pos, endOf(n)} : null;
        }

        /** A relationship read from a verb ("called at", "call at"), not from a noun such as "goods". */
        boolean verbal(Evidence.TermHit h) {
            for (int i = h.from(); i < h.to(); i++) if (ev.toks.get(i).lower().endsWith("ed")) return true;
            return h.to() - h.from() > 1 && Words.isStop(ev.toks.get(h.to() - 1));
        }

        boolean onlyFunctionWords(int from, int to, int within) {
            if (to - from > within) return false;
            for (int i = from; i < to; i++) if (!Words.isStop(ev.toks.get(i))) return false;
            return true;
        }

        void link(QNode a, QNode b) {
            links.computeIfAbsent(a.id, k -> new HashSet<>()).add(b.id);
            links.computeIfAbsent(b.id, k -> new HashSet<>()).add(a.id);
            why.add(a.label + " is joined to " + b.label + " as the question's grammar says");
        }

        int endOf(QNode n) {
            for (Evidence.TermHit h : ev.terms) if (h.from() == n.pos && h.kind() == TermKind.LABEL) return h.to();
            if (!n.mention) for (ValueFinder.Hit h : ev.values) if (h.from() == n.pos) return h.to();
            return n.pos + 1;
        }

        QNode adjacentClass(ValueFinder.Hit h) {
            for (QNode n : nodes) {
                if (!n.mention || !n.values.isEmpty()) continue;
                int end = endOf(n);
                boolean before = end == h.from() || end + 1 == h.from() && ev.toks.get(end).lower().equals("the");
                boolean after = n.pos == h.to();
                if ((before || after) && (schema.isSubLabel(h.value().label(), n.label) || schema.isSubLabel(n.label, h.value().label()))) {
                    return n;
                }
            }
            return null;
        }

        boolean classBetween(int a, int b) {
            for (QNode n : nodes) if (n.mention && n.pos > a && n.pos < b) return true;
            return false;
        }

        QNode focus() {
            for (QNode n : nodes) if (n.mention && !n.modifier && !n.negated && n.values.isEmpty()) return n;
            // "Which calls at Marrowby …": the class a relationship word names, before a named instance.
            QNode first = null;
            for (QNode n : nodes) {
                if (!n.negated && n.values.isEmpty() && (first == null || n.pos < first.pos)) first = n;
            }
            if (first != null) return first;
            for (QNode n : nodes) if (!n.negated) return n;
            return null;
        }

        // ---- the shape of the answer ----

        final class Shape {
            String kind = "list";
            String error;
            Agg agg;
            QNode measureNode;
            String measureKey;
            QNode groupNode;
            final List<String[]> groupKeys = new ArrayList<>();
            Boolean descending;
            boolean limitOne;
            QNode orderNode;
            String orderKey;
            boolean distinctCount;
            boolean members;
            final List<String[]> projections = new ArrayList<>();
            /** The projections the question asks for by name (not those its conditions add). */
            final List<String[]> asked = new ArrayList<>();
            final List<QNode> extraNodes = new ArrayList<>();
        }

        Shape shape(QNode focus, int negAt) {
            Shape s = shapeCore(focus, negAt);
            placeCategorical();
            return s;
        }

        /** Code-list values become conditions on the nearest named node of their class (after the shape added its nodes). */
        void placeCategorical() {
            for (ValueFinder.Hit h : categorical) {
                QNode holder = placeCategorical(h);
                if (holder == null) {
                    why.add("value '" + h.value().value() + "' ignored: no " + h.value().label() + " in the question");
                    continue;
                }
                String[] existing = holder.conds.stream().filter(c -> c[0].equals(h.value().key()) && (c[1].equals("=") || c[1].equals("IN")))
                        .findFirst().orElse(null);
                if (existing == null) {
                    holder.conds.add(new String[] {h.value().key(), "=", literal(h.value().value())});
                } else {
                    holder.conds.remove(existing);
                    String list = existing[1].equals("=") ? existing[2] : existing[2].substring(1, existing[2].length() - 1);
                    holder.conds.add(new String[] {h.value().key(), "IN", "[" + list + ", " + literal(h.value().value()) + "]"});
                }
            }
        }

        Shape shapeCore(QNode focus, int negAt) {
            Shape s = new Shape();
            int countAt = ev.indexOfPhrase("how", "many");
            if (countAt < 0) countAt = ev.indexOfPhrase("number", "of");
            boolean average = ev.hasWord("average", "mean");
            boolean total = ev.hasWord("total", "sum", "overall", "altogether");
            Cue sup = null;
            int supAt = -1;
            for (Words.Tok t : ev.toks) {
                Cue c = SUPERLATIVES.get(t.lower());
                if (c != null && !(t.lower().equals("most") && t.index() + 1 < ev.toks.size()
                        && ev.toks.get(t.index() + 1).lower().equals("recent"))) {
                    sup = c;
                    supAt = t.index();
                    break;
                }
            }
            boolean compare = nodes.stream().anyMatch(n -> n.values.size() >= 2)
                    && (ev.hasWord("compare", "more", "less", "fewer", "versus", "vs") || sup != null);

            // Conditions from values, numbers, periods and yes/no properties.
            for (QNode n : nodes) {
                if (n.values.size() == 1) n.conds.add(new String[] {n.valueKey, "=", literal(n.values.get(0))});
                else if (n.values.size() > 1) {
                    List<String> lits = n.values.stream().map(Interpreter::literal).toList();
                    n.conds.add(new String[] {n.valueKey, "IN", "[" + String.join(", ", lits) + "]"});
                }
            }
            Set<Evidence.TermHit> usedProps = new HashSet<>();
            for (Quantities.Quantity q : ev.quantities) {
                if (succession != null && q == succession.count()) continue;
                Evidence.TermHit prop = propertyFor(q, focus);
                String key = prop != null ? prop.name() : fallbackProperty(q, focus);
                if (key == null) {
                    why.add("no property takes the value \"" + span(q.from(), q.to()) + "\"");
                    continue;
                }
                if (prop != null) usedProps.add(prop);
                QNode holder = holder(key, prop != null ? prop.from() : q.from(), negAt);
                addCondition(holder, key, q);
                // A comparison's values are worth showing; an equality's are known ("40-foot containers").
                // Only the answer's own values: the dates that pick a carrier's calls are not asked of the carrier.
                if (!isBoolean(key) && (q.op() != Quantities.Op.EQ || q.period()) && holder == focus) {
                    s.projections.add(new String[] {String.valueOf(holder.id), key});
                }
            }
            for (Evidence.TermHit h : chosenProperties()) {
                if (!isBoolean(h.name()) || usedProps.contains(h)) continue;
                if (h.partial() && h.score() < 0.45) continue;
                boolean negated = h.from() > 0 && Set.of("not", "non", "un").contains(ev.toks.get(h.from() - 1).lower());
                QNode holder = holder(h.name(), h.from(), -1);
                holder.conds.add(new String[] {h.name(), "=", negated ? "false" : "true"});
                usedProps.add(h);
            }

            // Compare: alternatives of one node, measured by a count or a sum of another.
            if (compare) {
                QNode alt = nodes.stream().filter(n -> n.values.size() >= 2).findFirst().orElseThrow();
                s.kind = "compare";
                s.groupNode = alt;
                measure(s, focus == alt ? null : focus, average, true, usedProps, alt);
                s.descending = true;
                return s;
            }
            // Superlative: "the most X" counts X per answer; "the heaviest" orders by a property or a sum of one.
            if (sup != null) {
                s.kind = "superlative";
                s.descending = sup.descending();
                s.limitOne = true;
                QNode counted = sup.hints().isEmpty() ? classRightAfter(supAt) : null;
                Evidence.TermHit prop = counted != null ? null : propertyNear(supAt, sup.hints(), focus);
                if (counted == null) counted = classAfter(supAt, 3);
                if (counted != null && counted != focus && (prop == null || prop.from() > counted.pos)) {
                    s.agg = Agg.COUNT;
                    s.measureNode = counted;
                    s.groupNode = focus;
                } else if (prop != null) {
                    usedProps.add(prop);
                    QNode holder = holder(prop.name(), prop.from(), negAt);
                    if (holder == focus && !total) {
                        s.orderNode = holder;
                        s.orderKey = prop.name();
                        holder.conds.add(new String[] {prop.name(), "IS NOT NULL", ""});
                        askedProperties(s, focus, usedProps);
                    } else {
                        s.agg = average ? Agg.AVG : Agg.SUM;
                        s.measureNode = holder;
                        s.measureKey = prop.name();
                        s.groupNode = focus;
                    }
                } else {
                    return error(s, "the superlative \"" + ev.toks.get(supAt).raw() + "\" names no property or class to rank by");
                }
                return s;
            }
            // Grouping: "each X", "per X", or "by P" after "break down" / "split".
            int eachAt = Math.max(ev.indexOf("each"), ev.indexOf("per"));
            boolean breakdown = ev.hasWord("break", "breakdown", "split", "broken", "grouped");
            if (eachAt >= 0 || breakdown) {
                s.kind = "group";
                QNode g = eachAt >= 0 ? groupTarget(eachAt) : null;
                if (g != null) s.groupNode = g;
                if (g == null || breakdown && ev.indexOf("by") > eachAt) {
                    int from = eachAt >= 0 ? eachAt : Math.max(0, ev.indexOf("by"));
                    for (Evidence.TermHit h : chosenProperties()) {
                        if (h.from() > from && !isBoolean(h.name())) {
                            QNode holder = holder(h.name(), h.from(), negAt);
                            s.groupKeys.add(new String[] {String.valueOf(holder.id), h.name()});
                            usedProps.add(h);
                        }
                    }
                    // "split by import and export": the values of a code list name the key to group by.
                    for (ValueFinder.Hit h : List.copyOf(categorical)) {
                        if (h.from() > from) {
                            QNode holder = placeCategorical(h);
                            if (holder == null) continue;
                            String item = holder.id + "." + h.value().key();
                            if (s.groupKeys.stream().noneMatch(k -> (k[0] + "." + k[1]).equals(item))) {
                                s.groupKeys.add(new String[] {String.valueOf(holder.id), h.value().key()});
                            }
                            categorical.remove(h);
                        }
                    }
                    if (s.groupKeys.isEmpty() && g == null) return error(s, "nothing to group by after \"each\"/\"per\"");
                }
                if (countAt >= 0 && !total && !average) {
                    s.agg = Agg.COUNT;
                    QNode counted = classAfter(countAt, 4);
                    s.measureNode = counted != null ? counted : focus;
                } else {
                    measure(s, countAt >= 0 ? classAfter(countAt, 4) : focus, average, false, usedProps, g);
                }
                if (s.measureNode == s.groupNode && s.groupNode != null && s.measureKey == null) {
                    QNode other = nodes.stream().filter(n -> n != s.groupNode && n.mention && !n.negated).findFirst().orElse(null);
                    if (other == null) return error(s, "grouping needs something to count per group");
                    s.measureNode = other;
                }
                s.descending = true;
                // "How many … each …, and which are they?": the counted things are listed beside their count.
                s.members = s.agg == Agg.COUNT && MEMBERS.stream().anyMatch(p -> ev.indexOfPhrase(p) >= 0);
                return s;
            }
            if (countAt >= 0 && !total) {
                s.kind = "count";
                QNode counted = classAfter(countAt, 4);
                s.agg = Agg.COUNT;
                s.measureNode = counted != null ? counted : focus;
                return s;
            }
            if ((total || average) && countAt < 0) {
                Evidence.TermHit prop = numericProperty(usedProps);
                if (prop != null) {
                    s.kind = "count";
                    s.agg = average ? Agg.AVG : Agg.SUM;
                    s.measureNode = holder(prop.name(), prop.from(), negAt);
                    s.measureKey = prop.name();
                    return s;
                }
            }
            if (countAt >= 0) {
                s.kind = "count";
                s.agg = Agg.COUNT;
                QNode counted = classAfter(countAt, 4);
                s.measureNode = counted != null ? counted : focus;
                return s;
            }
            // A list: the answer's name, the properties the question asks for, and classes asked "with" it.
            s.kind = negAt >= 0 ? "exists" : "list";
            askedProperties(s, focus, usedProps);
            inOrder(s);
            int with = Math.max(ev.indexOf("with"), Math.max(ev.indexOf("together"), ev.indexOf("their")));
            if (with >= 0) {
                for (QNode n : nodes) {
                    if (n != focus && n.mention && !n.negated && n.values.isEmpty() && n.pos > with) s.extraNodes.add(n);
                }
            }
            return s;
        }

        /**
         * "In order", "in sequence": the answer is ordered by the property that word reads as (a position or a
         * time), which is shown too. Otherwise a list showing one asked measure is ordered by it, dates first to
         * last and amounts largest first (common practice for a listing; a bag comparison ignores it).
         */
        void inOrder(Shape s) {
            for (String w : List.of("order", "sequence")) {
                int at = ev.indexOfPhrase("in", w);
                if (at < 0) continue;
                for (Evidence.TermHit h : propertyReadings()) {
                    if (h.from() != at + 1 || !(isTemporal(h.name()) || type(h.name()) == ValueType.INTEGER)) continue;
                    QNode holder = holderIfAny(h.name(), h.from());
                    if (holder == null || holder.negated) continue;
                    s.orderNode = holder;
                    s.orderKey = h.name();
                    s.descending = false;
                    why.add("\"in " + w + "\" orders by " + h.name());
                    return;
                }
            }
            for (String[] p : s.asked) {
                String key = p[1];
                if (!isTemporal(key) && type(key) != ValueType.INTEGER && type(key) != ValueType.FLOAT) continue;
                s.orderNode = nodes.stream().filter(n -> String.valueOf(n.id).equals(p[0])).findFirst().orElse(null);
                if (s.orderNode == null) continue;
                s.orderKey = key;
                s.descending = !isTemporal(key);
                return;
            }
        }

        boolean isTemporal(String key) {
            ValueType t = type(key);
            return t == ValueType.DATE || t == ValueType.DATETIME || t == ValueType.LOCALDATETIME;
        }

        /** Properties the question asks to see: named in full, or by one noun when the answer holds them. */
        void askedProperties(Shape s, QNode focus, Set<Evidence.TermHit> usedProps) {
            for (Evidence.TermHit h : chosenProperties()) {
                if (usedProps.contains(h) || isBoolean(h.name())) continue;
                QNode holder = holderIfAny(h.name(), h.from());
                // A single word of a longer label is asked for only as a noun of the answer ("its method").
                String w = ev.toks.get(h.from()).lower();
                if (h.partial() && (holder != focus || w.endsWith("ed") || w.endsWith("ing"))) continue;
                if (holder == null || holder.negated) continue;
                if (s.projections.stream().noneMatch(p -> p[0].equals(String.valueOf(holder.id)) && p[1].equals(h.name()))) {
                    s.projections.add(new String[] {String.valueOf(holder.id), h.name()});
                    s.asked.add(new String[] {String.valueOf(holder.id), h.name()});
                }
            }
        }

        /** The named node of a compatible class nearest to a code-list value, or null. */
        QNode placeCategorical(ValueFinder.Hit h) {
            QNode best = null;
            for (QNode n : nodes) {
                if (!(schema.isSubLabel(n.label, h.value().label()) || schema.isSubLabel(h.value().label(), n.label))) continue;
                if (best == null || Math.abs(n.pos - h.from()) < Math.abs(best.pos - h.from())) best = n;
            }
            return best;
        }

        /** The group named after "each"/"per": a class, or the far end of a relationship ("per country of origin"). */
        QNode groupTarget(int at) {
            for (Evidence.TermHit h : ev.bestOf(TermKind.RELATIONSHIP)) {
                if (h.from() != at + 1) continue;
                List<dev.termgate.schema.Endpoint> eps = schema.relType(h.name()).map(r -> r.endpoints()).orElse(List.of());
                if (eps.isEmpty() || eps.get(0).to() == null) continue;
                String range = eps.get(0).to();
                for (QNode n : nodes) if (schema.isSubLabel(n.label, range)) return n;
            }
            return classAfter(at, 3);
        }

        /**
         * Property readings of spans where a property is (nearly) the best reading: "goods" is a commodity, not
         * the partial reading "dangerous goods"; but "size" may be any property with that word.
         */
        List<Evidence.TermHit> propertyReadings() {
            if (readings != null) return readings;
            Map<Integer, Double> bestAll = new HashMap<>();
            Map<Integer, Double> bestProp = new HashMap<>();
            for (Evidence.TermHit h : ev.terms) {
                bestAll.merge(h.from(), h.score(), Math::max);
                if (h.kind() == TermKind.PROPERTY) bestProp.merge(h.from(), h.score(), Math::max);
            }
            List<Evidence.TermHit> out = new ArrayList<>();
            for (Evidence.TermHit h : ev.termsOf(TermKind.PROPERTY)) {
                if (bestProp.get(h.from()) >= bestAll.get(h.from()) - 0.15) out.add(h);
            }
            readings = out;
            return out;
        }

        /** Per span, the property reading whose class the question names, else the strongest. */
        List<Evidence.TermHit> chosenProperties() {
            Map<Integer, Evidence.TermHit> best = new LinkedHashMap<>();
            Map<Integer, Double> score = new HashMap<>();
            for (Evidence.TermHit h : propertyReadings()) {
                double sc = h.score() + (holderIfAny(h.name(), h.from()) != null && !anyDomain(h.name()) ? 0.5 : 0);
                if (!best.containsKey(h.from()) || sc > score.get(h.from())) {
                    best.put(h.from(), h);
                    score.put(h.from(), sc);
                }
            }
            return List.copyOf(best.values());
        }

        boolean anyDomain(String key) {
            return schema.property(key).map(PropertyKey::anyDomain).orElse(true);
        }

        Shape error(Shape s, String message) {
            s.error = message;
            return s;
        }

        /** Sets what a compare or group shape aggregates: a numeric property named in the question, else a count. */
        void measure(Shape s, QNode countDefault, boolean average, boolean compare, Set<Evidence.TermHit> used, QNode group) {
            Evidence.TermHit prop = numericProperty(used);
            if (prop != null) {
                used.add(prop);
                s.agg = average ? Agg.AVG : Agg.SUM;
                s.measureNode = holder(prop.name(), prop.from(), -1);
                s.measureKey = prop.name();
                return;
            }
            s.agg = Agg.COUNT;
            QNode counted = countDefault;
            if (counted == null || counted == group) {
                counted = nodes.stream().filter(n -> n != group && n.mention && !n.negated && n.values.isEmpty()).findFirst().orElse(null);
            }
            s.measureNode = counted;
        }

        /** The strongest numeric property named (partial readings only when a node that holds them is named). */
        Evidence.TermHit numericProperty(Set<Evidence.TermHit> used) {
            Evidence.TermHit best = null;
            double bestScore = 0;
            for (Evidence.TermHit h : propertyReadings()) {
                if (used.contains(h)) continue;
                ValueType t = type(h.name());
                if (t != ValueType.INTEGER && t != ValueType.FLOAT) continue;
                boolean held = holderIfAny(h.name(), h.from()) != null;
                if (h.partial() && !held) continue;
                double score = h.score() + (held ? 0.2 : 0);
                if (score > bestScore) {
                    bestScore = score;
                    best = h;
                }
            }
            return best;
        }

        QNode classAfter(int at, int within) {
            for (QNode n : nodes) {
                if ((n.mention || n.fromRelationship) && n.pos > at && n.pos <= at + within + 1 && !n.modifier) return n;
            }
            for (QNode n : nodes) if ((n.mention || n.fromRelationship) && n.pos > at && n.pos <= at + within + 1) return n;
            return null;
        }

        /** The class named right after a cue word ("the most ships"), skipping "the", "total", "number of". */
        QNode classRightAfter(int at) {
            int i = at + 1;
            while (i < ev.toks.size() && Set.of("the", "total", "number", "of", "many").contains(ev.toks.get(i).lower())) i++;
            for (QNode n : nodes) if ((n.mention || n.fromRelationship) && n.pos == i) return n;
            return null;
        }

        /** The property a superlative ranks by: one named right after it, or one whose words the superlative hints at. */
        Evidence.TermHit propertyNear(int at, List<String> hints, QNode focus) {
            int by = ev.indexOf("by");
            for (Evidence.TermHit h : propertyReadings()) {
                if (isBoolean(h.name())) continue;
                if (h.partial() && holderIfAny(h.name(), h.from()) == null) continue;
                if (h.from() > at && h.from() <= at + 4 || by >= 0 && h.from() == by + 1 || by >= 0 && h.from() == by + 2) return h;
            }
            if (!hints.isEmpty()) {
                // The words after the superlative ("longest quay") may name the property together with the hint.
                Set<String> near = new HashSet<>();
                for (int i = at + 1; i < Math.min(ev.toks.size(), at + 3); i++) near.add(ev.toks.get(i).stem());
                String best = null;
                double bestScore = 0;
                Set<String> candidates = new LinkedHashSet<>();
                for (QNode n : nodes) if (!n.negated) candidates.addAll(ownProperties(n.label));
                for (String key : candidates) {
                    ValueType t = type(key);
                    if (t == ValueType.STRING || t == ValueType.BOOLEAN) continue;
                    List<String> words = labelStems(key);
                    double score = 0;
                    for (String hint : hints) {
                        String h = Words.stem(hint);
                        if (words.stream().anyMatch(w -> w.startsWith(h))) score += 1;
                    }
                    if (score == 0) continue;
                    for (String w : words) if (near.contains(w)) score += 0.5;
                    if (holderIfAny(key, at) == focus) score += 0.25;
                    if (score > bestScore) {
                        bestScore = score;
                        best = key;
                    }
                }
                if (best != null) {
                    // Words after the superlative that named the property are no class of their own ("quay").
                    List<String> words = labelStems(best);
                    String key = best;
                    nodes.removeIf(n -> n.mention && n.pos > at && n.pos <= at + 2 && !schema.allowsProperty(n.label, key)
                            && words.stream().anyMatch(w -> Words.same(w, ev.toks.get(n.pos).stem()) > 0));
                    why.add("\"" + ev.toks.get(at).raw() + "\" ranks by " + best);
                    return new Evidence.TermHit(TermKind.PROPERTY, best, at, at + 1, 0.7, true);
                }
            }
            return null;
        }

        List<String> ownProperties(String label) {
            List<String> out = new ArrayList<>();
            for (String key : schema.propertiesOf(label)) {
                PropertyKey p = schema.property(key).orElse(null);
                if (p != null && !p.anyDomain()) out.add(key);
            }
            return out;
        }

        List<String> labelStems(String key) {
            List<String> out = new ArrayList<>(Words.stems(String.join(" ", dev.termgate.schema.Names.words(key))));
            schema.property(key).ifPresent(p -> {
                p.info().labels().forEach(l -> out.addAll(Words.stems(l.text())));
                p.info().altLabels().forEach(l -> out.addAll(Words.stems(l.text())));
            });
            return out;
        }

        // ---- properties and the nodes that hold them ----

        boolean isBoolean(String key) {
            return type(key) == ValueType.BOOLEAN;
        }

        ValueType type(String key) {
            return schema.property(key).map(PropertyKey::valueType).orElse(ValueType.ANY);
        }

        boolean fits(String key, Quantities.Quantity q) {
            ValueType t = type(key);
            if (q.period()) {
                return t == ValueType.DATE || t == ValueType.DATETIME || t == ValueType.LOCALDATETIME
                        || t == ValueType.INTEGER && key.toLowerCase(Locale.ROOT).contains("year");
            }
            return (t == ValueType.INTEGER || t == ValueType.FLOAT) && !key.toLowerCase(Locale.ROOT).contains("year");
        }

        /** The property a number or period belongs to: the nearest named one that can hold it (before it first). */
        Evidence.TermHit propertyFor(Quantities.Quantity q, QNode focus) {
            Evidence.TermHit best = null;
            double bestScore = -1;
            for (Evidence.TermHit h : propertyReadings()) {
                if (!fits(h.name(), q)) continue;
                int dist = h.to() <= q.from() ? q.from() - h.to() : h.from() - q.to() + 2;
                if (dist > 9) continue;
                double score = h.score() - 0.05 * dist + unitBonus(h.name(), q)
                        + (holderIfAny(h.name(), h.from()) != null ? 0.5 : 0);
                if (score > bestScore) {
                    bestScore = score;
                    best = h;
                }
            }
            return best;
        }

        double unitBonus(String key, Quantities.Quantity q) {
            if (q.unit().isEmpty()) return 0;
            List<String> words = labelStems(key);
            if (words.contains(q.unit())) return 0.5;
            if (isWeightUnit(q.unit()) && words.stream().anyMatch(Run::isWeightUnit)) return 0.3;
            return 0;
        }

        static boolean isWeightUnit(String stem) {
            return stem.equals("tonn") || stem.equals("ton") || stem.equals("t") || stem.equals("kg") || stem.equals("kilogram");
        }

        /** With no property named: the one property of a fitting type that the answer's class (or another named class) has. */
        String fallbackProperty(Quantities.Quantity q, QNode focus) {
            List<QNode> order = new ArrayList<>();
            order.add(focus);
            nodes.stream().filter(n -> n != focus).forEach(order::add);
            // With a period and no property named, an event's date or time is meant before a year-valued number.
            if (q.period()) {
                order.sort((a, b) -> Integer.compare(Math.abs(a.pos - q.from()), Math.abs(b.pos - q.from())));
                for (QNode n : order) {
                    List<String> temporal = ownProperties(n.label).stream().filter(k -> fits(k, q) && type(k) != ValueType.INTEGER).sorted().toList();
                    if (!temporal.isEmpty()) return temporal.get(0);
                }
            }
            for (QNode n : order) {
                List<String> fitting = ownProperties(n.label).stream().filter(k -> fits(k, q)).toList();
                if (fitting.size() == 1) return fitting.get(0);
                if (!q.unit().isEmpty()) {
                    List<String> byUnit = fitting.stream().filter(k -> unitBonus(k, q) >= 0.5).toList();
                    if (byUnit.size() == 1) return byUnit.get(0);
                }
            }
            return null;
        }

        QNode holderIfAny(String key, int pos) {
            QNode best = null;
            int bestDist = Integer.MAX_VALUE;
            for (QNode n : nodes) {
                if (!schema.allowsProperty(n.label, key)) continue;
                PropertyKey p = schema.property(key).orElse(null);
                // A key with no domain fits any node; prefer the answer's node for it by distance only.
                int dist = Math.abs(n.pos - pos) + (p != null && p.anyDomain() && !n.mention ? 2 : 0);
                if (dist < bestDist) {
                    bestDist = dist;
                    best = n;
                }
            }
            return best;
        }

        /** The node that holds the key: an existing one that may carry it, else a new node of the key's class. */
        QNode holder(String key, int pos, int negAt) {
            QNode n = holderIfAny(key, pos);
            if (n != null) return n;
            PropertyKey p = schema.property(key).orElseThrow();
            String label = p.domains().stream().sorted().findFirst().orElse(null);
            QNode added = new QNode(nextId++, label, pos, false);
            added.negated = negAt >= 0 && pos > negAt;
            nodes.add(added);
            why.add("property " + key + " brings in " + label);
            return added;
        }

        void addCondition(QNode n, String key, Quantities.Quantity q) {
            ValueType t = type(key);
            if (q.period()) {
                if (t == ValueType.INTEGER) {
                    n.conds.add(new String[] {key, q.op().symbol, String.valueOf((int) q.value())});
                    return;
                }
                String lo = temporal(t, q.start());
                String hi = temporal(t, q.end());
                switch (q.op()) {
                    case EQ -> {
                        n.conds.add(new String[] {key, ">=", lo});
                        n.conds.add(new String[] {key, "<", hi});
                    }
                    case LT -> n.conds.add(new String[] {key, "<", lo});
                    case GT -> n.conds.add(new String[] {key, ">=", hi});
                    case GE -> n.conds.add(new String[] {key, ">=", lo});
                    case LE -> n.conds.add(new String[] {key, "<", hi});
                }
                return;
            }
            double v = q.value() * unitFactor(key, q);
            String lit = t == ValueType.INTEGER || v == Math.rint(v) && Math.abs(v) < 1e15 ? String.valueOf((long) v) : String.valueOf(v);
            n.conds.add(new String[] {key, q.op().symbol, lit});
        }

        /** Tonnes in the question against a key in kilograms, and the reverse. */
        double unitFactor(String key, Quantities.Quantity q) {
            if (!isWeightUnit(q.unit())) return 1;
            List<String> words = labelStems(key);
            boolean keyKg = words.contains("kg") || words.contains("kilogram");
            boolean keyTonnes = words.contains("tonn") || words.contains("ton") || words.contains("t");
            boolean qTonnes = !q.unit().equals("kg") && !q.unit().equals("kilogram");
            if (keyKg && qTonnes) return 1000;
            if (keyTonnes && !qTonnes) return 0.001;
            return 1;
        }

        String temporal(ValueType t, LocalDate d) {
            return t == ValueType.DATE ? "date('" + d + "')" : "datetime('" + d + "T00:00:00Z')";
        }

        // ---- the interpretation tree ----

        /** Grows the tree from the focus; negated terminals form their own tree hanging off the focus. */
        String connect(QNode focus) {
            linkEvents();
            for (QNode n : nodes) terminalClasses.add(n.label);
            Set<String> mentioned = new HashSet<>();
            for (Evidence.TermHit h : ev.termsOf(TermKind.RELATIONSHIP)) mentioned.add(h.name());
            List<QNode> tree = new ArrayList<>(List.of(focus));
            List<QNode> todo = new ArrayList<>();
            List<QNode> negTodo = new ArrayList<>();
            for (QNode n : nodes) {
                if (n == focus) continue;
                (n.negated ? negTodo : todo).add(n);
            }
            String missing = bestTree(focus, todo, mentioned, edges);
            if (missing != null) return missing;
            return bestTree(focus, negTodo, mentioned, negEdges);
        }

        /**
         * The cheapest tree over all orders in which the terminals can be joined (a better Steiner approximation
         * than one greedy pass when a named relationship makes a longer first hop pay off); greedy beyond six.
         */
        String bestTree(QNode focus, List<QNode> todo, Set<String> mentioned, List<PEdge> out) {
            if (todo.isEmpty()) return null;
            List<List<QNode>> orders = new ArrayList<>();
            if (todo.size() <= 4) permutations(new ArrayList<>(todo), 0, orders);
            double bestCost = Double.MAX_VALUE;
            double bestJudged = Double.MAX_VALUE;
            List<PEdge> best = null;
            double saved = pathCost;
            int savedId = nextId;
            String missing = null;
            for (List<QNode> order : orders) {
                List<PEdge> trial = new ArrayList<>();
                pathCost = 0;
                nextId = savedId;
                String m = grow(new ArrayList<>(List.of(focus)), new ArrayList<>(order), mentioned, trial, true);
                if (m != null) {
                    missing = m;
                    continue;
                }
                // A tree that joins what the grammar pairs only through other terminals is a worse reading.
                double judged = pathCost + LINK_PENALTY * brokenLinks(trial, focus, order);
                if (judged < bestJudged - 1e-9) {
                    bestJudged = judged;
                    bestCost = pathCost;
                    best = trial;
                }
            }
            if (best == null) {
                pathCost = 0;
                nextId = savedId;
                List<PEdge> trial = new ArrayList<>();
                missing = grow(new ArrayList<>(List.of(focus)), new ArrayList<>(todo), mentioned, trial, false);
                if (missing != null) return missing;
                best = trial;
                bestCost = pathCost;
            }
            int maxId = nextId;
            for (PEdge e : best) maxId = Math.max(maxId, Math.max(e.a().id, e.b().id) + 1);
            nextId = maxId;
            out.addAll(best);
            pathCost = saved + bestCost;
            return null;
        }

        /** How many pairs the grammar joins are connected in the tree only through another terminal. */
        int brokenLinks(List<PEdge> tree, QNode focus, List<QNode> terminals) {
            Set<QNode> ends = new HashSet<>(terminals);
            ends.add(focus);
            int broken = 0;
            for (QNode a : ends) {
                for (QNode b : ends) {
                    if (a.id >= b.id || !links.getOrDefault(a.id, Set.of()).contains(b.id)) continue;
                    List<QNode> path = treePath(tree, a, b);
                    if (path == null || path.subList(1, path.size() - 1).stream().anyMatch(ends::contains)) broken++;
                }
            }
            return broken;
        }

        /** The nodes on the tree's path from a to b, both included; null when they are not connected. */
        List<QNode> treePath(List<PEdge> tree, QNode a, QNode b) {
            Map<QNode, QNode> prev = new HashMap<>();
            java.util.ArrayDeque<QNode> queue = new java.util.ArrayDeque<>(List.of(a));
            prev.put(a, a);
            while (!queue.isEmpty()) {
                QNode n = queue.poll();
                if (n == b) break;
                for (PEdge e : tree) {
                    QNode o = e.a() == n ? e.b() : e.b() == n ? e.a() : null;
                    if (o != null && prev.putIfAbsent(o, n) == null) queue.add(o);
                }
            }
            if (!prev.containsKey(b)) return null;
            List<QNode> path = new ArrayList<>();
            for (QNode n = b; n != a; n = prev.get(n)) path.add(0, n);
            path.add(0, a);
            return path;
        }

        /**
         * A node the tree passed through on the way to another terminal, of the terminal's class or a superclass:
         * the terminal is that node (a Steiner point reused), joined at no further cost.
         */
        QNode passedThrough(List<QNode> tree, QNode t) {
            for (QNode m : tree) {
                if (m.pos == -1 && !m.mention && m.values.isEmpty() && m.conds.isEmpty() && !m.fromRelationship
                        && schema.isSubLabel(t.label, m.label)) return m;
            }
            return null;
        }

        void permutations(List<QNode> items, int k, List<List<QNode>> out) {
            if (k == items.size()) {
                out.add(new ArrayList<>(items));
                return;
            }
            for (int i = k; i < items.size(); i++) {
                java.util.Collections.swap(items, k, i);
                permutations(items, k + 1, out);
                java.util.Collections.swap(items, k, i);
            }
        }

        /** Where a path to {@code t} may start: the tree nodes the grammar joins it to, else (or unless {@code joined}) anywhere. */
        Map<Integer, String> starts(List<QNode> tree, QNode t, boolean joined) {
            Map<Integer, String> starts = new LinkedHashMap<>();
            Set<Integer> partners = links.getOrDefault(t.id, Set.of());
            for (int i = 0; i < tree.size(); i++) {
                if (!joined || partners.contains(tree.get(i).id)) starts.put(i, tree.get(i).label);
            }
            if (joined && starts.isEmpty()) for (int i = 0; i < tree.size(); i++) starts.put(i, tree.get(i).label);
            return starts;
        }

        /** The class graph's cheapest path, remembered: the joining orders tried for one question repeat most searches. */
        SchemaGraph.Path cheapest(Map<Integer, String> starts, String goal, Set<String> mentioned, Set<String> avoid) {
            String key = starts + "|" + goal + "|" + avoid;
            if (paths.containsKey(key)) return paths.get(key);
            SchemaGraph.Path p = graph.cheapest(starts, goal, mentioned, avoid);
            paths.put(key, p);
            return p;
        }

        String grow(List<QNode> tree, List<QNode> todo, Set<String> mentioned, List<PEdge> out, boolean inOrder) {
            while (!todo.isEmpty()) {
                SchemaGraph.Path best = null;
                QNode bestNode = null;
                QNode reused = inOrder ? passedThrough(tree, todo.get(0)) : null;
                if (reused != null) {
                    QNode t = todo.remove(0);
                    out.replaceAll(e -> e.a() == reused ? new PEdge(t, e.type(), e.b(), e.symmetric(), e.hops())
                            : e.b() == reused ? new PEdge(e.a(), e.type(), t, e.symmetric(), e.hops()) : e);
                    tree.set(tree.indexOf(reused), t);
                    continue;
                }
                for (QNode t : inOrder ? todo.subList(0, 1) : todo) {
                    SchemaGraph.Path p = links.containsKey(t.id) ? cheapest(starts(tree, t, true), t.label, mentioned, terminalClasses) : null;
                    if (p == null) p = cheapest(starts(tree, t, true), t.label, mentioned, Set.of());
                    if (p == null) p = cheapest(starts(tree, t, false), t.label, mentioned, Set.of());
                    if (p != null && (best == null || p.cost() < best.cost())) {
                        best = p;
                        bestNode = t;
                    }
                }
                if (best == null) return todo.get(0).label;
                QNode prev = tree.get(best.startNode());
                for (int i = 0; i < best.hops().size(); i++) {
                    SchemaGraph.Hop hop = best.hops().get(i);
                    QNode next = i == best.hops().size() - 1 ? bestNode : new QNode(nextId++, hop.label(), -1, false);
                    if (next != bestNode) tree.add(next);
                    out.add(hop.forward() ? new PEdge(prev, hop.edge().type(), next, hop.edge().symmetric())
                            : new PEdge(next, hop.edge().type(), prev, hop.edge().symmetric()));
                    prev = next;
                }
                pathCost += best.cost();
                tree.add(bestNode);
                todo.remove(bestNode);
            }
            return null;
        }

        // ---- writing the query ----

        String write(QNode focus, Shape s) {
            Map<Integer, QNode> byId = new HashMap<>();
            Set<String> usedVars = new HashSet<>();
            List<QNode> all = new ArrayList<>(nodes);
            for (PEdge e : edges) addIfAbsent(all, e.a(), e.b());
            for (PEdge e : negEdges) addIfAbsent(all, e.a(), e.b());
            for (QNode n : all) {
                byId.put(n.id, n);
                String base = n.label.substring(0, 1).toLowerCase(Locale.ROOT);
                String v = base;
                for (int k = 2; usedVars.contains(v); k++) v = base + k;
                usedVars.add(v);
                n.var = v;
            }
            StringBuilder q = new StringBuilder("MATCH ");
            Set<QNode> declared = new HashSet<>();
            List<String> parts = new ArrayList<>();
            for (PEdge e : edges) parts.add(edgeText(e, declared));
            for (QNode n : all) {
                if (!n.negated && !declared.contains(n) && (n == focus || !n.conds.isEmpty() || n.mention || !n.values.isEmpty())
                        && partOfPositive(n, focus)) {
                    parts.add(nodeText(n, declared));
                }
            }
            q.append(String.join(", ", parts));
            List<String> where = new ArrayList<>();
            for (QNode n : all) if (!n.negated) for (String[] c : n.conds) where.add(cond(n, c));
            if (!negEdges.isEmpty()) {
                Set<QNode> inner = new HashSet<>(declared);
                List<String> negParts = new ArrayList<>();
                for (PEdge e : negEdges) negParts.add(edgeText(e, inner));
                List<String> negWhere = new ArrayList<>();
                for (QNode n : all) if (n.negated) for (String[] c : n.conds) negWhere.add(cond(n, c));
                where.add("NOT EXISTS { MATCH " + String.join(", ", negParts)
                        + (negWhere.isEmpty() ? "" : " WHERE " + String.join(" AND ", negWhere)) + " }");
            }
            if (!where.isEmpty()) q.append(" WHERE ").append(String.join(" AND ", where.stream().distinct().toList()));
            q.append(" RETURN ");
            List<String> items = new ArrayList<>();
            String aggAlias = null;
            if (s.agg != null) {
                List<String> keys = new ArrayList<>();
                if (s.groupNode != null) keys.add(display(s.groupNode));
                for (String[] g : s.groupKeys) keys.add(byId.get(Integer.parseInt(g[0])).var + "." + g[1]);
                items.addAll(keys);
                String measure = switch (s.agg) {
                    case COUNT -> "count(DISTINCT " + s.measureNode.var + ")";
                    case SUM -> "sum(" + s.measureNode.var + "." + s.measureKey + ")";
                    case AVG -> "avg(" + s.measureNode.var + "." + s.measureKey + ")";
                };
                aggAlias = s.agg == Agg.COUNT ? "count" : s.agg == Agg.SUM ? "total" : "average";
                items.add(measure + " AS " + aggAlias);
                if (s.agg == Agg.COUNT && s.members) items.add("collect(DISTINCT " + display(s.measureNode) + ") AS members");
                q.append(String.join(", ", items));
                if (s.descending != null && keys.size() > 1 && !s.limitOne) {
                    // A breakdown by several keys reads as a table: ordered by its keys.
                    q.append(" ORDER BY ").append(String.join(", ", keys));
                } else if (s.descending != null && !keys.isEmpty()) {
                    q.append(" ORDER BY ").append(aggAlias).append(s.descending ? " DESC" : "");
                    if (s.limitOne) q.append(" LIMIT 1");
                }
                return q.toString();
            }
            boolean distinct = !edges.isEmpty();
            // "What is the HS code of Methanol?": the named thing is known; only what is asked about is shown.
            boolean askedOnly = !focus.values.isEmpty() && !s.projections.isEmpty();
            String shown = askedOnly ? null : displayOrNull(focus);
            if (shown != null) items.add(shown);
            // An event with no name (a port call, an inspection) is told apart by when it happened.
            if (shown == null && !askedOnly) for (String k : whenKeys(focus)) items.add(focus.var + "." + k);
            for (QNode n : s.extraNodes) {
                String d = displayOrNull(n);
                if (d != null && !items.contains(d)) items.add(d);
            }
            if (s.orderNode != null) {
                String o = s.orderNode.var + "." + s.orderKey;
                if (!items.contains(o)) items.add(o);
            }
            for (String[] p : s.projections) {
                QNode n = byId.get(Integer.parseInt(p[0]));
                if (n == null || n.negated) continue;
                String item = n.var + "." + p[1];
                if (!items.contains(item)) items.add(item);
            }
            if (items.isEmpty()) items.add(focus.var);
            q.append(distinct ? "DISTINCT " : "").append(String.join(", ", items));
            if (s.orderNode != null) {
                q.append(" ORDER BY ").append(s.orderNode.var).append('.').append(s.orderKey).append(s.descending ? " DESC" : "");
                if (s.limitOne) q.append(" LIMIT 1");
            }
            return q.toString();
        }

        /** The dates and times the class itself declares, in the ontology's order. */
        List<String> whenKeys(QNode n) {
            return ownProperties(n.label).stream().filter(this::isTemporal).toList();
        }

        boolean partOfPositive(QNode n, QNode focus) {
            if (n == focus) return true;
            for (PEdge e : edges) if (e.a() == n || e.b() == n) return true;
            return false;
        }

        void addIfAbsent(List<QNode> all, QNode... ns) {
            for (QNode n : ns) if (!all.contains(n)) all.add(n);
        }

        String display(QNode n) {
            String d = displayOrNull(n);
            return d != null ? d : n.var;
        }

        String displayOrNull(QNode n) {
            return profile.displayKey(n.label, schema).map(k -> n.var + "." + k).orElse(null);
        }

        String edgeText(PEdge e, Set<QNode> declared) {
            String a = nodeText(e.a(), declared);
            String b = nodeText(e.b(), declared);
            if (e.symmetric()) return a + "-[:" + e.type() + e.hops() + "]-" + b;
            return a + "-[:" + e.type() + e.hops() + "]->" + b;
        }

        String nodeText(QNode n, Set<QNode> declared) {
            if (declared.add(n)) return "(" + n.var + ":" + n.label + ")";
            return "(" + n.var + ")";
        }

        String cond(QNode n, String[] c) {
            if (c[1].equals("IS NOT NULL")) return n.var + "." + c[0] + " IS NOT NULL";
            return n.var + "." + c[0] + " " + c[1] + " " + c[2];
        }
    }

    static String literal(String s) {
        return "'" + s.replace("\\", "\\\\").replace("'", "\\'") + "'";
    }
}
