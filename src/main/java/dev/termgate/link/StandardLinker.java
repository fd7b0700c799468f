package dev.termgate.link;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Lexical, semantic and value evidence combined into one ranking, then completed into a connected
 * sub-schema. See {@link Linkers#standard}.
 */
final class StandardLinker implements SchemaLinker {

    // Weights and thresholds: common practice, tuned on the project's own test questions (never on a
    // question set the tests then score).
    static final double SEMANTIC_WEIGHT = 0.6;
    /** Cosine similarities of MiniLM below this say nothing; at FLOOR + SPAN the evidence is full. */
    static final double SEMANTIC_FLOOR = 0.30;
    static final double SEMANTIC_SPAN = 0.35;
    static final double VALUE_SCORE = 1.0;
    static final double VALUE_PROPERTY_SCORE = 0.6;
    static final double CLASS_MIN = 0.45;
    static final int MAX_LINKED_CLASSES = 5;
    static final double RELATED_BONUS = 0.3;
    static final double NAMING_PROPERTY_SCORE = 0.35;
    static final double BETWEEN_SCORE = 0.3;
    static final double ENDPOINT_FACTOR = 0.7;
    static final double RECOGNISED = 0.45;
    static final double MIN_SCORE = 0.1;
    static final double MAX_PATH_COST = 3.0;
    static final int MAX_EMBED_WORDS = 128;
    static final int CENTRAL_CLASSES = 6;
    static final int MAX_PHRASES = 4;
    static final int BETWEEN_PER_PAIR = 3;
    static final double DEPRECATED_FACTOR = 0.7;
    /** A superclass with more subclasses than this is too general to say how two classes relate (Thing). */
    static final int SPECIFIC_MAX = 30;
    static final double NEIGHBOUR_SCORE = 0.15;
    static final int NEIGHBOURS_PER_CLASS = 6;

    private final GraphSchema schema;
    private final LinkOptions options;
    private final ClassGraph classGraph;
    private final Map<String, LexicalIndex> lexicalByLanguage = new ConcurrentHashMap<>();
    private final Map<String, TermVectors> vectorsByLanguage = new ConcurrentHashMap<>();
    private final List<TermRef> terms;
    private final Map<TermRef, Integer> termIndex = new HashMap<>();
    /** Effective endpoints per relationship type, computed once: the schema derives them on every call. */
    private final Map<String, List<Endpoint>> endpoints = new HashMap<>();
    /** Property keys that name what they belong to (name, title, label, …). */
    private final Set<String> namingKeys = new java.util.TreeSet<>();
    /** Property keys by a class that declares them as its domain. */
    private final Map<String, Set<String>> keysDeclaredOn = new HashMap<>();
    /** Relationship types by a class they are declared on (as domain or range), for "declared between". */
    private final Map<String, Set<String>> declaredOn = new HashMap<>();

    StandardLinker(GraphSchema schema, LinkOptions options) {
        this.schema = schema;
        this.options = options;
        this.classGraph = new ClassGraph(schema);
        for (PropertyKey p : schema.properties().values()) {
            if (isNaming(p.name())) namingKeys.add(p.name());
            for (String d : p.domains()) keysDeclaredOn.computeIfAbsent(d, k -> new java.util.TreeSet<>()).add(p.name());
        }
        for (String r : schema.relTypes().keySet()) {
            List<Endpoint> eps = schema.effectiveEndpoints(r);
            endpoints.put(r, eps);
            for (Endpoint e : eps) {
                if (!e.anyFrom()) declaredOn.computeIfAbsent(e.from(), k -> new LinkedHashSet<>()).add(r);
                if (!e.anyTo()) declaredOn.computeIfAbsent(e.to(), k -> new LinkedHashSet<>()).add(r);
            }
        }
        List<TermRef> all = new ArrayList<>();
        for (TermKind k : TermKind.values()) schema.terms(k).forEach(t -> all.add(new TermRef(k, t.name())));
        this.terms = List.copyOf(all);
        for (int i = 0; i < terms.size(); i++) termIndex.put(terms.get(i), i);
    }

    void warmUp() {
        String lang = options.language().equals(LinkOptions.AUTO) ? "en" : options.language();
        if (options.lexical()) lexical(lang);
        if (options.semantic()) vectors(lang);
    }

    /** The term vectors for a language, computing or reading them on first use. Visible for the benchmark. */
    TermVectors vectors(String lang) {
        return vectorsByLanguage.computeIfAbsent(lang,
                l -> TermVectors.load(schema, terms, l, Embedder.miniLm(), options.cacheDir()));
    }

    private LexicalIndex lexical(String lang) {
        return lexicalByLanguage.computeIfAbsent(lang, l -> new LexicalIndex(schema, l));
    }

    @Override
    public Linking link(String question, GraphSchema schema) {
        if (schema != this.schema) return new StandardLinker(schema, options).link(question, schema);
        return new Run(question).link();
    }

    /** The state of linking one question. */
    private final class Run {
        private final String question;
        private final String lang;
        private final List<String> notices = new ArrayList<>();
        private final Map<TermRef, Double> score = new HashMap<>();
        private final Map<TermRef, List<String>> evidence = new HashMap<>();
        private final List<Text.Token> tokens;
        private double bestDirect;
        /** Cosine of each term (in {@link #terms} order) with the question, when embeddings are used. */
        private double[] sims;

        Run(String question) {
            this.question = question == null ? "" : question.strip();
            String l = options.language();
            this.lang = l.equals(LinkOptions.AUTO) ? Text.guessLanguage(this.question) : l;
            this.tokens = Text.tokens(this.question, lang);
        }

        Linking link() {
            if (options.lexical()) addLexical();
            if (options.semantic()) addSemantic();
            addValues();
            penaliseDeprecated();
            bestDirect = score.values().stream().mapToDouble(Double::doubleValue).max().orElse(0);
            boolean recognised = bestDirect >= RECOGNISED;
            List<String> classes = recognised ? linkedClasses() : List.of();
            List<String> pulled = recognised ? pullEndpoints(classes) : List.of();
            Set<String> anchors = new LinkedHashSet<>(classes);
            anchors.addAll(pulled);
            if (recognised) {
                relateProperties(anchors);
                relateRelTypes(anchors);
                addNamingProperties(anchors);
                addOwnKeys(pulled);
                addNeighbourhood(anchors);
            } else {
                anchors = new LinkedHashSet<>(centralPart());
            }
            List<TermRef> ranked = rank();
            ranked = connect(ranked, anchors);
            List<LinkedTerm> out = new ArrayList<>(ranked.size());
            for (TermRef t : ranked) {
                out.add(new LinkedTerm(t.kind(), t.name(), round(score.get(t)), evidence.getOrDefault(t, List.of())));
            }
            return new Linking(out, !recognised, notices);
        }

        private void addLexical() {
            Map<TermRef, LexicalIndex.Hit> hits = lexical(lang).match(tokens);
            hits.forEach((t, h) -> add(t, h.score(), h.evidence() + " (lexical " + fmt(h.score()) + ")"));
        }

        private void addSemantic() {
            String text = question;
            String[] words = text.split("\\s+");
            if (words.length > MAX_EMBED_WORDS) {
                text = String.join(" ", java.util.Arrays.copyOf(words, MAX_EMBED_WORDS));
                notices.add("the question is long; only its first " + MAX_EMBED_WORDS + " words were used for embedding");
            }
            if (text.isBlank()) return;
            TermVectors tv = vectors(lang);
            if (tv.cacheNote() != null && !notices.contains(tv.cacheNote())) notices.add(tv.cacheNote());
            sims = tv.similarities(Embedder.miniLm().embed(text));
            String[] from = new String[sims.length];
            // A whole question dilutes a word no name contains ("born" for birthPlace): such phrases are also
            // embedded alone, and each term keeps its best similarity.
            for (String phrase : phrases()) {
                // A phrase that is the whole text cannot score higher than the text did.
                if (phrase.equals(text)) continue;
                double[] ps = tv.similarities(Embedder.miniLm().embed(phrase));
                for (int i = 0; i < ps.length; i++) {
                    if (ps[i] > sims[i]) {
                        sims[i] = ps[i];
                        from[i] = phrase;
                    }
                }
            }
            for (int i = 0; i < sims.length; i++) {
                double s = Math.min(1, (sims[i] - SEMANTIC_FLOOR) / SEMANTIC_SPAN);
                if (s <= 0) continue;
                double w = options.lexical() ? SEMANTIC_WEIGHT * s : s;
                String what = from[i] == null ? "the question" : "\"" + from[i] + "\"";
                add(terms.get(i), w, "meaning close to " + what + " (cosine " + fmt(sims[i]) + ")");
            }
        }

        /**
         * Runs of content words to embed on their own: with lexical evidence, the runs no term name contains;
         * without it, every run between stop words.
         */
        private List<String> phrases() {
            LexicalIndex lex = options.lexical() ? lexical(lang) : null;
            List<String> out = new ArrayList<>();
            int runStart = -1;
            int runEnd = -1;
            for (Text.Token t : tokens) {
                boolean wanted = !t.stop() && (lex == null || !lex.known(t));
                if (wanted) {
                    if (runStart < 0) runStart = t.start();
                    runEnd = t.start() + t.raw().length();
                } else if (runStart >= 0 && (!t.stop() || lex == null)) {
                    out.add(question.substring(runStart, runEnd));
                    runStart = -1;
                }
            }
            if (runStart >= 0) out.add(question.substring(runStart, runEnd));
            // A run without a letter (a number, a date, a code) is a value, not a meaning: its embedding only
            // adds noise to every term's similarity, at the cost of a model inference.
            return out.stream().filter(StandardLinker::worthEmbedding).distinct().limit(MAX_PHRASES).toList();
        }

        private void addValues() {
            for (ValueMention m : options.values().find(question)) {
                TermRef label = new TermRef(TermKind.LABEL, m.label());
                if (!schema.labels().containsKey(m.label())) continue;
                String where = "value \"" + m.value() + "\" is a " + m.label();
                if (score.containsKey(label) && evidence.get(label).contains(where)) continue;
                add(label, VALUE_SCORE, where);
                m.property().filter(schema.properties()::containsKey).ifPresent(p ->
                        add(new TermRef(TermKind.PROPERTY, p), VALUE_PROPERTY_SCORE,
                                "holds \"" + m.value() + "\" of a " + m.label()));
            }
        }

        private void penaliseDeprecated() {
            for (Map.Entry<TermRef, Double> e : score.entrySet()) {
                if (TermVectors.info(schema, e.getKey()).deprecated()) {
                    e.setValue(e.getValue() * DEPRECATED_FACTOR);
                    evidence.get(e.getKey()).add("deprecated in the ontology");
                }
            }
        }

        /** Classes with strong direct evidence: the terminals of the connection. */
        private List<String> linkedClasses() {
            List<Map.Entry<TermRef, Double>> labels = score.entrySet().stream()
                    .filter(e -> e.getKey().kind() == TermKind.LABEL)
                    .sorted(Map.Entry.<TermRef, Double>comparingByValue().reversed().thenComparing(e -> e.getKey().name()))
                    .toList();
            if (labels.isEmpty()) return List.of();
            double floor = Math.max(CLASS_MIN, 0.5 * labels.get(0).getValue());
            List<String> out = new ArrayList<>();
            for (Map.Entry<TermRef, Double> e : labels) {
                if (e.getValue() < floor || out.size() >= MAX_LINKED_CLASSES) break;
                out.add(e.getKey().name());
            }
            return out;
        }

        /**
         * The classes at the other end of relationship types the question names: "who directed …" needs the
         * class of directors even when the question never names it.
         */
        private List<String> pullEndpoints(List<String> classes) {
            List<TermRef> rels = score.entrySet().stream()
                    .filter(e -> e.getKey().kind() == TermKind.RELATIONSHIP && e.getValue() >= CLASS_MIN)
                    .sorted(Map.Entry.<TermRef, Double>comparingByValue().reversed())
                    .limit(3).map(Map.Entry::getKey).toList();
            List<String> out = new ArrayList<>();
            for (TermRef r : rels) {
                List<Endpoint> eps = endpoints.get(r.name());
                Set<String> froms = new LinkedHashSet<>();
                Set<String> tos = new LinkedHashSet<>();
                for (Endpoint e : eps) {
                    if (!e.anyFrom()) froms.add(e.from());
                    if (!e.anyTo()) tos.add(e.to());
                }
                boolean fromLinked = touches(froms, classes);
                boolean toLinked = touches(tos, classes);
                double s = ENDPOINT_FACTOR * score.get(r);
                if (fromLinked && !toLinked && tos.size() <= 3) pull(tos, r, s, "range", out);
                else if (toLinked && !fromLinked && froms.size() <= 3) pull(froms, r, s, "domain", out);
                else if (!fromLinked && !toLinked) {
                    if (froms.size() <= 2) pull(froms, r, s, "domain", out);
                    if (tos.size() <= 2) pull(tos, r, s, "range", out);
                }
            }
            List<TermRef> props = score.entrySet().stream()
                    .filter(e -> e.getKey().kind() == TermKind.PROPERTY && e.getValue() >= CLASS_MIN)
                    .sorted(Map.Entry.<TermRef, Double>comparingByValue().reversed())
                    .limit(3).map(Map.Entry::getKey).toList();
            for (TermRef p : props) {
                PropertyKey key = schema.properties().get(p.name());
                if (key.anyDomain() || key.domains().size() > 2) continue;
                boolean held = false;
                for (String c : classes) held |= schema.allowsProperty(c, p.name());
                for (String c : out) held |= schema.allowsProperty(c, p.name());
                // "duty" names CustomsDeclaration.dutyAmount: the class holding the key is needed too.
                if (!held) pull(key.domains(), p, ENDPOINT_FACTOR * score.get(p), "holder", out);
            }
            return out;
        }

        private boolean touches(Set<String> declared, Collection<String> classes) {
            for (String c : classes) {
                for (String d : declared) {
                    if (schema.isSubLabel(c, d) || schema.isSubLabel(d, c)) return true;
                }
            }
            return false;
        }

        private void pull(Set<String> labels, TermRef r, double s, String end, List<String> out) {
            for (String l : labels) {
                if (!schema.labels().containsKey(l)) continue;
                add(new TermRef(TermKind.LABEL, l), s, end + " of " + r.name());
                if (!out.contains(l)) out.add(l);
            }
        }

        /** A property key of a linked class that the question also hints at is very likely needed. */
        private void relateProperties(Set<String> anchors) {
            for (TermRef t : List.copyOf(score.keySet())) {
                if (t.kind() != TermKind.PROPERTY) continue;
                PropertyKey p = schema.properties().get(t.name());
                if (p.anyDomain()) continue;
                for (String c : anchors) {
                    if (schema.allowsProperty(c, p.name())) {
                        add(t, RELATED_BONUS * Math.min(1, score.get(t) / RECOGNISED), "property of " + c);
                        break;
                    }
                }
            }
        }

        /** Relationship types between linked classes: boosted when hinted at, added when declared exactly. */
        private void relateRelTypes(Set<String> anchors) {
            List<String> cs = List.copyOf(anchors);
            for (TermRef t : List.copyOf(score.keySet())) {
                if (t.kind() != TermKind.RELATIONSHIP) continue;
                String between = between(t.name(), cs, false);
                if (between != null) {
                    add(t, RELATED_BONUS * Math.min(1, score.get(t) / RECOGNISED), "between " + between);
                }
            }
            Set<String> candidates = new LinkedHashSet<>();
            for (String c : cs) {
                for (String sup : specificSupers(c)) candidates.addAll(declaredOn.getOrDefault(sup, Set.of()));
            }
            // Popular pairs (Person and Organization) have dozens of types: keep the few closest in meaning.
            Map<String, List<String>> byPair = new HashMap<>();
            for (String r : candidates) {
                if (scoreOf(new TermRef(TermKind.RELATIONSHIP, r)) >= BETWEEN_SCORE) continue;
                String between = between(r, cs, true);
                if (between != null) byPair.computeIfAbsent(between, k -> new ArrayList<>()).add(r);
            }
            byPair.forEach((pair, rs) -> closest(rs).stream()
                    .limit(BETWEEN_PER_PAIR)
                    .forEach(r -> topUp(new TermRef(TermKind.RELATIONSHIP, r), BETWEEN_SCORE, "declared between " + pair)));
        }

        /**
         * The last tier of the ranking: relationship types declared on each anchor (or a specific superclass)
         * and the classes at their other end. A card with budget to spare shows them, so a query can take a
         * path the question does not spell out ("berthed at terminals" goes through port calls and voyages).
         */
        private void addNeighbourhood(Set<String> anchors) {
            for (String c : anchors) {
                Set<String> supers = specificSupers(c);
                List<String> own = new ArrayList<>();
                for (String sup : supers) {
                    for (String k : keysDeclaredOn.getOrDefault(sup, Set.of())) {
                        if (!own.contains(k) && scoreOf(new TermRef(TermKind.PROPERTY, k)) < NEIGHBOUR_SCORE) own.add(k);
                    }
                }
                own.stream()
                        .sorted(Comparator.comparingDouble((String k) -> -similarity(new TermRef(TermKind.PROPERTY, k)))
                                .thenComparing(k -> k))
                        .limit(NEIGHBOURS_PER_CLASS / 2)
                        .forEach(k -> topUp(new TermRef(TermKind.PROPERTY, k), NEIGHBOUR_SCORE, "property of " + c));
                List<String> rels = new ArrayList<>();
                for (String sup : supers) {
                    for (String r : declaredOn.getOrDefault(sup, Set.of())) {
                        if (!rels.contains(r) && scoreOf(new TermRef(TermKind.RELATIONSHIP, r)) < NEIGHBOUR_SCORE) rels.add(r);
                    }
                }
                for (String r : closest(rels).stream().limit(NEIGHBOURS_PER_CLASS).toList()) {
                    topUp(new TermRef(TermKind.RELATIONSHIP, r), NEIGHBOUR_SCORE, "next to " + c);
                    for (Endpoint e : endpoints.get(r)) {
                        String other = supers.contains(e.from()) ? e.to() : supers.contains(e.to()) ? e.from() : null;
                        if (other == null || !schema.labels().containsKey(other) || !isSpecific(other)) continue;
                        topUp(new TermRef(TermKind.LABEL, other), NEIGHBOUR_SCORE * 0.9, "next to " + c + " by " + r);
                    }
                }
            }
        }

        private List<String> closest(Collection<String> rels) {
            return rels.stream()
                    .sorted(Comparator.comparingDouble((String r) -> -similarity(new TermRef(TermKind.RELATIONSHIP, r)))
                            .thenComparing(r -> r))
                    .toList();
        }

        /** The class and those of its superclasses specific enough to say something about it. */
        private Set<String> specificSupers(String c) {
            Set<String> out = new LinkedHashSet<>();
            for (String sup : schema.superLabels(c)) {
                if (sup.equals(c) || isSpecific(sup)) out.add(sup);
            }
            return out;
        }

        private boolean isSpecific(String label) {
            return schema.subLabels(label).size() <= SPECIFIC_MAX;
        }

        /**
         * "A and B" when the type connects two anchors; {@code exact}: declared on them or on a specific
         * superclass, not on a general one such as Thing.
         */
        private String between(String type, List<String> cs, boolean exact) {
            for (Endpoint e : endpoints.get(type)) {
                if (e.anyFrom() || e.anyTo()) continue;
                for (String a : cs) {
                    for (String b : cs) {
                        // A type from a class to itself (Person KNOWS Person) does not join two anchors.
                        if (exact && a.equals(b)) continue;
                        if (exact ? specificSupers(a).contains(e.from()) && specificSupers(b).contains(e.to())
                                : schema.isSubLabel(a, e.from()) && schema.isSubLabel(b, e.to())) {
                            return a + " and " + b;
                        }
                    }
                }
            }
            return null;
        }

        /** What a query returns for a node is usually its name: the shortest name-like keys of each anchor. */
        private void addNamingProperties(Set<String> anchors) {
            for (String c : anchors) {
                namingKeys.stream()
                        .filter(p -> schema.allowsProperty(c, p))
                        .sorted(Comparator.comparingInt((String p) -> Text.words(p).size()).thenComparing(p -> p))
                        .limit(2)
                        .forEach(p -> {
                            TermRef t = new TermRef(TermKind.PROPERTY, p);
                            double s = score.getOrDefault(t, 0.0);
                            if (s < NAMING_PROPERTY_SCORE) add(t, NAMING_PROPERTY_SCORE - s, "names a " + c);
                        });
            }
        }


        /**
         * A class reached only as the end of a named relationship (QuantitativeValue for "number of employees")
         * is read through its own keys: the two closest in meaning, shortest first when there is no meaning.
         */
        private void addOwnKeys(List<String> pulled) {
            for (String c : pulled) {
                keysDeclaredOn.getOrDefault(c, Set.of()).stream()
                        .sorted(Comparator.comparingDouble((String k) -> -similarity(new TermRef(TermKind.PROPERTY, k)))
                                .thenComparingInt(String::length).thenComparing(k -> k))
                        .limit(2)
                        .forEach(k -> topUp(new TermRef(TermKind.PROPERTY, k), NAMING_PROPERTY_SCORE, "key of " + c));
            }
        }

        /** No recognisable term: the most central classes by PageRank over the class graph. */
        private List<String> centralPart() {
            List<String> central = classGraph.central(CENTRAL_CLASSES);
            notices.add("no term of the question was recognised; showing the most central part of the ontology");
            double s = Math.max(bestDirect, MIN_SCORE) + 1;
            for (String c : central) {
                // Above anything weakly matched, in PageRank order.
                add(new TermRef(TermKind.LABEL, c), s, "central class (PageRank " + fmt(classGraph.pageRankOf(c)) + ")");
                s -= 0.01;
            }
            addNamingProperties(new LinkedHashSet<>(central));
            return central;
        }

        private List<TermRef> rank() {
            return score.entrySet().stream()
                    .filter(e -> e.getValue() >= MIN_SCORE)
                    .sorted(Map.Entry.<TermRef, Double>comparingByValue().reversed()
                            .thenComparing(e -> e.getKey().kind())
                            .thenComparing(e -> e.getKey().name()))
                    .limit(options.maxTerms())
                    .map(Map.Entry::getKey)
                    .toList();
        }

        /**
         * Joins the anchors into one sub-schema (shortest-path heuristic for a Steiner tree: anchors in rank
         * order, each joined to the tree built so far by its cheapest path) and places each path's terms right
         * after the anchor it joins.
         */
        private List<TermRef> connect(List<TermRef> ranked, Set<String> anchors) {
            List<TermRef> order = new ArrayList<>(ranked);
            List<String> terminals = new ArrayList<>();
            for (TermRef t : ranked) {
                if (t.kind() == TermKind.LABEL && anchors.contains(t.name()) && classGraph.contains(t.name())) {
                    terminals.add(t.name());
                }
            }
            if (terminals.size() < 2) return order;
            Set<String> tree = new LinkedHashSet<>(List.of(terminals.get(0)));
            for (String target : terminals.subList(1, terminals.size())) {
                Optional<List<ClassGraph.Step>> path = classGraph.connect(tree, target, this::relCost, MAX_PATH_COST);
                if (path.isEmpty()) {
                    notices.add(target + " is not connected to " + String.join(", ", tree) + " within a few steps");
                    tree.add(target);
                    continue;
                }
                List<ClassGraph.Step> steps = path.get();
                tree.add(target);
                if (steps.isEmpty()) continue;
                String from = steps.get(0).from();
                String what = "connects " + from + " to " + target;
                TermRef anchor = new TermRef(TermKind.LABEL, target);
                int at = order.indexOf(anchor);
                double s = score.get(anchor);
                for (ClassGraph.Step st : steps) {
                    List<TermRef> parts = new ArrayList<>();
                    if (st.relType() != null) parts.add(new TermRef(TermKind.RELATIONSHIP, st.relType()));
                    if (!st.to().equals(target)) parts.add(new TermRef(TermKind.LABEL, st.to()));
                    tree.add(st.to());
                    for (TermRef p : parts) {
                        int pos = order.indexOf(p);
                        if (pos >= 0 && pos <= at) {
                            evidence.computeIfAbsent(p, k -> new ArrayList<>()).add(what);
                            continue;
                        }
                        if (pos >= 0) order.remove(pos);
                        order.add(at + 1, p);
                        at++;
                        // Ranked lower until now, so its own score is below the anchor's: keep the list sorted.
                        score.put(p, s);
                        evidence.computeIfAbsent(p, k -> new ArrayList<>()).add(what);
                    }
                }
            }
            return order;
        }

        private double similarity(TermRef t) {
            if (sims == null) return 0;
            Integer i = termIndex.get(t);
            return i == null ? 0 : sims[i];
        }

        private double relCost(String type) {
            double s = score.getOrDefault(new TermRef(TermKind.RELATIONSHIP, type), 0.0);
            return 1 - 0.6 * Math.min(1, s);
        }

        private double scoreOf(TermRef t) {
            return score.getOrDefault(t, 0.0);
        }

        /** Raises a term to at least {@code floor} (weak evidence plus a structural reason). */
        private void topUp(TermRef t, double floor, String why) {
            double have = scoreOf(t);
            if (have < floor) add(t, floor - have, why);
        }

        private void add(TermRef t, double s, String why) {
            if (s <= 0) return;
            score.merge(t, s, Double::sum);
            evidence.computeIfAbsent(t, k -> new ArrayList<>()).add(why);
        }
    }

    private static double round(double d) {
        return Math.round(d * 1000) / 1000.0;
    }

    /** Two decimals, as {@code %.2f} would print them (without its cost: it runs for every scored term). */
    static String fmt(double d) {
        long c = Math.round(Math.abs(d) * 100);
        String sign = Math.copySign(1.0, d) < 0 ? "-" : "";
        return sign + c / 100 + "." + (c % 100 < 10 ? "0" : "") + c % 100;
    }

    private static boolean isNaming(String key) {
        List<String> w = Text.words(key);
        return w.contains("name") || w.contains("title") || w.equals(List.of("label"));
    }

    /** The schema this linker was built for. */
    GraphSchema schema() {
        return schema;
    }

    /** Whether a phrase may carry a meaning for the embedding model: it has a letter in some script. */
    static boolean worthEmbedding(String phrase) {
        return phrase.codePoints().anyMatch(Character::isLetter);
    }
}
