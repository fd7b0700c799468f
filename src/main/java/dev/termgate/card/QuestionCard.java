package dev.termgate.card;

import dev.termgate.link.LinkedTerm;
import dev.termgate.link.Linking;
import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.Set;

/**
 * Chooses and renders the card for one question within a token budget (see {@link Cards#forQuestion}).
 *
 * <p>Counting: lines never start with white space, and both encodings split text at line ends before
 * merging bytes, so the tokens of the card are the sum of its lines' tokens (checked in CardTextTest against a
 * count of the whole text). Trying a term re-renders only the lines it changes, and each distinct line is
 * counted once, so a ranking of hundreds of terms over a large ontology stays cheap.
 */
final class QuestionCard {

    static final String FALLBACK_NOTICE = "no term of the question was recognised; the card shows the most central "
            + "part of the ontology instead";

    private record Ref(TermKind kind, String name) {}

    /** What a term brings: itself and the terms that keep the card a valid sub-schema, with the reason for each. */
    private record Addition(Map<Ref, String> refs) {}

    private final GraphSchema schema;
    private final Linking linking;
    private final int budget;
    private final TokenCounter counter;

    /** The card as chosen so far: its scope, the tokens of each body line by key, and their sum. */
    private CardScope current = CardScope.of(Set.of(), Set.of(), Set.of());
    private final Map<String, Integer> lineCost = new HashMap<>();
    private int bodyTokens;
    private final Map<String, Set<String>> mentionedByRel = new HashMap<>();

    /** A card with an addition tried: its scope, the new costs of the lines it changed, the new body sum. */
    private record Trial(CardScope scope, Map<String, Integer> costs, int body) {}

    private final Map<Ref, LinkedTerm> ranked = new LinkedHashMap<>();
    private final Map<Ref, Integer> rank = new HashMap<>();
    /** Shown terms in the order they were chosen, with the card's own reasons. */
    private final Map<Ref, List<String>> shown = new LinkedHashMap<>();
    private final List<String> notices = new ArrayList<>();

    QuestionCard(GraphSchema schema, Linking linking, int budget, TokenCounter counter) {
        this.schema = schema;
        this.linking = linking;
        this.budget = budget;
        this.counter = counter;
    }

    Card build() {
        notices.addAll(linking.notices());
        // The linker normally says itself that it fell back; the card says it only when the linker did not.
        if (linking.fallback() && linking.notices().isEmpty()) notices.add(FALLBACK_NOTICE);
        for (LinkedTerm t : linking.ranked()) {
            Ref r = new Ref(t.kind(), t.name());
            if (info(r).isEmpty()) {
                notices.add("the linker named " + t.kind().word() + " '" + t.name() + "', which the schema lacks; ignored");
                continue;
            }
            if (ranked.putIfAbsent(r, t) == null) rank.put(r, rank.size());
        }
        int smallestTried = Integer.MAX_VALUE;
        int skipped = 0;
        int remaining = ranked.size();
        for (Ref r : ranked.keySet()) {
            remaining--;
            if (shown.containsKey(r)) continue;
            Addition add = additionFor(r);
            Trial trial = trial(add);
            // The footer is not known yet: reserve room for the longest it can become (every term after this one
            // left out too). Its token count grows with the number, so the final card stays within the budget.
            int tokens = total(trial, CardText.footer(skipped + remaining, budget));
            if (tokens <= budget) {
                commit(add, trial);
            } else {
                skipped++;
                smallestTried = Math.min(smallestTried, tokens);
            }
        }
        if (shown.isEmpty() && !ranked.isEmpty()) throw new BudgetTooSmallException(budget, smallestTried);
        int leftOut = (int) ranked.keySet().stream().filter(r -> !shown.containsKey(r)).count();
        Optional<String> footer = CardText.footer(leftOut, budget);
        fillKeys(footer);
        if (leftOut > 0) {
            notices.add(leftOut + " ranked term" + (leftOut == 1 ? " was" : "s were") + " left out to stay within "
                    + budget + " tokens");
        }
        CardScope scope = current;
        String text = CardText.join(lines(scope, footer));
        // The line counts add up to the count of the whole text: the tokenizer never merges across a line end.
        // Counting the whole card again was half the cost of a card; tests run with assertions on check it.
        int tokens = total(new Trial(scope, Map.of(), bodyTokens), footer);
        assert tokens == counter.count(text) : "line-by-line count differs";
        if (tokens > budget) {
            throw new IllegalStateException("card of " + tokens + " tokens exceeds its budget of " + budget);
        }
        return new Card(text, tokens, OptionalInt.of(budget), counter.encoding(), terms(), leftOut,
                linking.fallback(), notices, scope);
    }

    /**
     * Budget left over goes to the keys of the labels shown, one key per label in turn (labels in the order
     * they were chosen, keys by name), so that the model can also pick what to return. A label gets no more keys
     * after its first that does not fit. Deprecated keys are not added this way: only a linker's ranking puts
     * them on a card.
     */
    private void fillKeys(Optional<String> footer) {
        List<List<String>> queues = new ArrayList<>();
        for (Ref r : List.copyOf(shown.keySet())) {
            if (r.kind() != TermKind.LABEL) continue;
            List<String> own = schema.properties().values().stream()
                    .filter(k -> k.domains().contains(r.name()))
                    .filter(k -> !k.info().deprecated())
                    .map(PropertyKey::name)
                    .filter(k -> !shown.containsKey(new Ref(TermKind.PROPERTY, k)))
                    .sorted().toList();
            if (!own.isEmpty()) queues.add(new ArrayList<>(own));
        }
        while (!queues.isEmpty()) {
            for (var it = queues.iterator(); it.hasNext(); ) {
                List<String> q = it.next();
                Ref k = new Ref(TermKind.PROPERTY, q.remove(0));
                if (!shown.containsKey(k)) {
                    Addition add = new Addition(Map.of(k, "key of a label shown, added with budget to spare"));
                    Trial trial = trial(add);
                    if (total(trial, footer) <= budget) {
                        commit(add, trial);
                    } else {
                        q.clear(); // a label's line only grows: stop at its first key that does not fit
                    }
                }
                if (q.isEmpty()) it.remove();
            }
        }
    }

    private Addition additionFor(Ref r) {
        Map<Ref, String> refs = new LinkedHashMap<>();
        refs.put(r, "");
        switch (r.kind()) {
            case LABEL -> { }
            case RELATIONSHIP -> endpointsToAdd(schema.relTypes().get(r.name()))
                    .forEach(l -> refs.putIfAbsent(new Ref(TermKind.LABEL, l), "endpoint of " + r.name()));
            case PROPERTY -> holderToAdd(schema.properties().get(r.name()))
                    .ifPresent(l -> refs.putIfAbsent(new Ref(TermKind.LABEL, l), "holds key " + r.name()));
        }
        return new Addition(refs);
    }

    /**
     * The labels a relationship type needs so that at least one of its endpoint pairs is on the card: none when a
     * pair is already covered (or a super type on the card shows them); otherwise the ends of the pair missing the
     * fewest, ties broken by the best rank of the missing ends, then by name.
     */
    private List<String> endpointsToAdd(RelType rel) {
        CardScope now = extend(current, List.of(new Ref(TermKind.RELATIONSHIP, rel.name())));
        if (rel.superTypes().stream().anyMatch(now.relTypes()::contains) && CardText.ownEndpoints(schema, rel).isEmpty()) {
            return List.of();
        }
        List<Endpoint> pairs = CardText.ownEndpoints(schema, rel);
        if (pairs.isEmpty()) pairs = schema.effectiveEndpoints(rel.name());
        if (pairs.isEmpty()) return List.of();
        List<String> best = null;
        Comparator<List<String>> order = Comparator.<List<String>>comparingInt(List::size)
                .thenComparingInt(this::bestRank)
                .thenComparing(l -> String.join(",", l));
        for (Endpoint e : pairs) {
            List<String> missing = new ArrayList<>(2);
            if (!CardText.onCard(now, e.from())) missing.add(e.from());
            if (!CardText.onCard(now, e.to()) && !missing.contains(e.to())) missing.add(e.to());
            if (best == null || order.compare(missing, best) < 0) best = missing;
        }
        return best;
    }

    /**
     * A label to hold a key when no label that declares it is on the card: a declaring label that a shown label
     * inherits from first (the key then reaches the shown label too), else the best-ranked declaring label, else
     * the first by name.
     */
    private Optional<String> holderToAdd(PropertyKey key) {
        if (key.anyDomain()) return Optional.empty();
        Set<String> shownLabels = current.labels();
        if (key.domains().stream().anyMatch(shownLabels::contains)) return Optional.empty();
        Optional<String> inherited = key.domains().stream().sorted()
                .filter(d -> shownLabels.stream().anyMatch(l -> schema.isSubLabel(l, d)))
                .findFirst();
        if (inherited.isPresent()) return inherited;
        return key.domains().stream()
                .filter(schema.labels()::containsKey)
                .min(Comparator.comparingInt((String d) -> rank.getOrDefault(new Ref(TermKind.LABEL, d), Integer.MAX_VALUE))
                        .thenComparing(Comparator.naturalOrder()));
    }

    private int bestRank(List<String> labels) {
        return labels.stream().mapToInt(l -> rank.getOrDefault(new Ref(TermKind.LABEL, l), Integer.MAX_VALUE))
                .min().orElse(-1);
    }

    private void commit(Addition add, Trial trial) {
        add.refs().forEach((r, why) -> {
            List<String> reasons = shown.computeIfAbsent(r, k -> new ArrayList<>());
            if (!why.isEmpty() && !reasons.contains(why)) reasons.add(why);
        });
        current = trial.scope();
        trial.costs().forEach((key, cost) -> {
            if (cost == 0) lineCost.remove(key);
            else lineCost.put(key, cost);
        });
        bodyTokens = trial.body();
    }

    private Trial trial(Addition add) {
        CardScope scope = extend(current, add.refs().keySet());
        Map<String, java.util.SortedSet<String>> ownKeys = CardText.ownKeys(schema, scope);
        Map<String, Integer> costs = new HashMap<>();
        int body = bodyTokens;
        for (String key : changedLines(add, scope)) {
            String line = CardText.line(schema, scope, ownKeys, key);
            int cost = line == null ? 0 : count(line);
            body += cost - lineCost.getOrDefault(key, 0);
            costs.put(key, cost);
        }
        return new Trial(scope, costs, body);
    }

    private int total(Trial trial, Optional<String> footer) {
        return count(CardText.questionHeader(schema, trial.scope())) + count(CardText.LEGEND) + trial.body()
                + footer.map(this::count).orElse(0);
    }

    /**
     * The body lines an addition can change: the headings, the lines of the terms added, the lines of the labels
     * that hold an added key, and the lines of shown relationship types whose endpoints mention an added label
     * or whose super type is added (its endpoints are then shown there).
     */
    private Set<String> changedLines(Addition add, CardScope scope) {
        Set<String> keys = new LinkedHashSet<>(List.of(CardText.LABELS_KEY, CardText.RELATIONSHIPS_KEY));
        Set<String> newLabels = new LinkedHashSet<>();
        Set<String> newRels = new LinkedHashSet<>();
        for (Ref r : add.refs().keySet()) {
            switch (r.kind()) {
                case LABEL -> {
                    keys.add(CardText.labelKey(r.name()));
                    newLabels.add(r.name());
                }
                case RELATIONSHIP -> {
                    keys.add(CardText.relKey(r.name()));
                    newRels.add(r.name());
                }
                case PROPERTY -> {
                    PropertyKey key = schema.properties().get(r.name());
                    if (key.anyDomain()) keys.add(CardText.ANY);
                    for (String d : key.domains()) if (scope.labels().contains(d)) keys.add(CardText.labelKey(d));
                }
            }
        }
        for (String r : current.relTypes()) {
            RelType rel = schema.relTypes().get(r);
            boolean endsAdded = mentioned(rel).stream().anyMatch(newLabels::contains);
            boolean superAdded = rel.superTypes().stream().anyMatch(newRels::contains);
            if (endsAdded || superAdded) keys.add(CardText.relKey(r));
        }
        return keys;
    }

    /** Every label a relationship type's line could show: own, inverse and inherited endpoints. */
    private Set<String> mentioned(RelType rel) {
        return mentionedByRel.computeIfAbsent(rel.name(), n -> {
            Set<String> out = new java.util.HashSet<>();
            List<Endpoint> pairs = new ArrayList<>(CardText.ownEndpoints(schema, rel));
            pairs.addAll(schema.effectiveEndpoints(n));
            for (Endpoint e : pairs) {
                if (e.from() != null) out.add(e.from());
                if (e.to() != null) out.add(e.to());
            }
            return out;
        });
    }

    private int count(String line) {
        return counter.countLine(line + "\n");
    }

    private List<String> lines(CardScope scope, Optional<String> footer) {
        List<String> lines = new ArrayList<>();
        lines.add(CardText.questionHeader(schema, scope));
        lines.add(CardText.LEGEND);
        lines.addAll(CardText.body(schema, scope));
        footer.ifPresent(lines::add);
        return lines;
    }

    private static CardScope extend(CardScope scope, java.util.Collection<Ref> refs) {
        Set<String> labels = new LinkedHashSet<>(scope.labels());
        Set<String> rels = new LinkedHashSet<>(scope.relTypes());
        Set<String> keys = new LinkedHashSet<>(scope.keys());
        for (Ref r : refs) {
            switch (r.kind()) {
                case LABEL -> labels.add(r.name());
                case RELATIONSHIP -> rels.add(r.name());
                case PROPERTY -> keys.add(r.name());
            }
        }
        return CardScope.of(labels, rels, keys);
    }

    private List<CardTerm> terms() {
        List<CardTerm> out = new ArrayList<>();
        shown.forEach((r, reasons) -> {
            TermInfo info = info(r).orElseThrow();
            LinkedTerm t = ranked.get(r);
            if (t == null) {
                out.add(Cards.plainTerm(info, reasons));
            } else {
                List<String> evidence = new ArrayList<>(t.evidence());
                reasons.forEach(w -> { if (!evidence.contains(w)) evidence.add(w); });
                out.add(new CardTerm(r.kind(), r.name(), info.iri(), OptionalDouble.of(t.score()), evidence));
            }
        });
        return out;
    }

    private Optional<TermInfo> info(Ref r) {
        return switch (r.kind()) {
            case LABEL -> schema.label(r.name()).map(l -> l.info());
            case RELATIONSHIP -> schema.relType(r.name()).map(RelType::info);
            case PROPERTY -> schema.property(r.name()).map(PropertyKey::info);
        };
    }
}
