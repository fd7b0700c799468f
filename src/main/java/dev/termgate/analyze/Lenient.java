package dev.termgate.analyze;

import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.TermInfo;

import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Lenient lookup of a written name among the terms of one kind, for "did you mean" and repair. Built once per
 * schema and kind; a lookup costs the same whatever the number of terms: exact maps for names and labels
 * compared after {@link Names#normalize}, and a symmetric-deletion index for names within edit distance 2
 * (each key is stored with every variant that has up to two characters deleted; a query's variants meet
 * them).
 *
 * <p>Tiers (scores) — common practice, spaced by {@link Fix#CLEAR_MARGIN} so a better tier is "clearly ahead":
 * same name up to case and separators 1.0; a term whose rdfs:label, skos:prefLabel or IRI local name reads the same 0.9;
 * a skos:altLabel synonym 0.85; edit distance 1: 0.8; edit distance 2: 0.7; a label within edit distance 1: 0.65.
 * How many edits are allowed depends on the shorter name's length, except that a name one letter short of a term
 * long enough for one edit is always within reach ({@code nme} → {@code name}).
 */
final class Lenient {

    record Match(String name, double score, String why) {}

    private static final int MAX_DELETES = 2;

    private record Entry(String key, String name, double base, String why) {}

    private final Map<String, List<Entry>> exact = new HashMap<>();
    private final Map<String, List<Integer>> deletions = new HashMap<>();
    private final List<Entry> fuzzy = new ArrayList<>();

    Lenient(Collection<TermInfo> terms) {
        for (TermInfo t : terms) {
            addExact(Names.normalize(t.name()), t.name(), 1.0, "same name up to case and separators");
            // The IRI's local name ranks with labels: when names collide, another term may own it.
            addExact(Names.normalize(t.localName()), t.name(), 0.9, "its IRI ends in '" + t.localName() + "'");
            for (LangString l : t.labels()) {
                addExact(Names.normalize(l.text()), t.name(), 0.9, "its label is \"" + l.text() + "\"");
            }
            for (LangString l : t.altLabels()) {
                addExact(Names.normalize(l.text()), t.name(), 0.85, "\"" + l.text() + "\" is a synonym of it");
            }
            addFuzzy(Names.normalize(t.name()), t.name(), 0.9, "");
            for (LangString l : t.labels()) addFuzzy(Names.normalize(l.text()), t.name(), 0.75, "label ");
        }
    }

    private void addExact(String key, String name, double score, String why) {
        if (key.isEmpty()) return;
        List<Entry> list = exact.computeIfAbsent(key, k -> new ArrayList<>(1));
        for (Entry e : list) if (e.name.equals(name)) return;
        list.add(new Entry(key, name, score, why));
    }

    private void addFuzzy(String key, String name, double base, String why) {
        if (key.length() < 3) return;
        int id = fuzzy.size();
        fuzzy.add(new Entry(key, name, base, why));
        for (String d : deletes(key, allowed(key.length()))) {
            deletions.computeIfAbsent(d, k -> new ArrayList<>(2)).add(id);
        }
    }

    /** How many edits a name of this length may differ by and still be suggested (common practice). */
    private static int allowed(int length) {
        if (length <= 3) return 0;
        if (length <= 5) return 1;
        return MAX_DELETES;
    }

    /** Ranked matches for a written name, best first, one per term. */
    List<Match> lookup(String written) {
        String key = Names.normalize(written);
        Map<String, Match> best = new LinkedHashMap<>();
        for (Entry e : exact.getOrDefault(key, List.of())) {
            if (e.name.equals(written)) continue;
            offer(best, new Match(e.name, e.base, e.why));
        }
        int max = allowed(key.length());
        if (key.length() >= 3) {
            Set<Integer> seen = new HashSet<>();
            for (String d : deletes(key, max)) {
                for (int id : deletions.getOrDefault(d, List.of())) {
                    if (!seen.add(id)) continue;
                    Entry e = fuzzy.get(id);
                    if (e.name.equals(written)) continue;
                    int dist = distance(key, e.key);
                    if (dist == 0 || dist > Math.min(max, allowed(e.key.length())) && !droppedLetter(key, e.key, dist)) {
                        continue;
                    }
                    double score = e.base - 0.1 * dist;
                    if (e.why.isEmpty()) {
                        offer(best, new Match(e.name, score, dist == 1 ? "one letter apart" : dist + " letters apart"));
                    } else if (dist == 1) {
                        offer(best, new Match(e.name, score, "its label is one letter apart"));
                    }
                }
            }
        }
        List<Match> out = new ArrayList<>(best.values());
        out.sort(Comparator.comparingDouble(Match::score).reversed().thenComparing(Match::name));
        return out;
    }

    /**
     * A written name one letter short of the term ({@code nme} for {@code name}): within reach even when the
     * written name is too short for fuzzy matching by its own length, since the term's length allows one edit.
     * The deletion index finds these without any deletion on the written side.
     */
    private static boolean droppedLetter(String written, String term, int dist) {
        return dist == 1 && term.length() == written.length() + 1 && allowed(term.length()) >= 1;
    }

    private static void offer(Map<String, Match> best, Match m) {
        Match old = best.get(m.name);
        if (old == null || old.score < m.score) best.put(m.name, m);
    }

    private static Set<String> deletes(String s, int max) {
        Set<String> out = new HashSet<>();
        out.add(s);
        List<String> frontier = List.of(s);
        for (int round = 0; round < max; round++) {
            List<String> next = new ArrayList<>();
            for (String f : frontier) {
                for (int i = 0; i < f.length(); i++) {
                    String d = f.substring(0, i) + f.substring(i + 1);
                    if (out.add(d)) next.add(d);
                }
            }
            frontier = next;
        }
        return out;
    }

    /** Optimal-string-alignment distance: insertions, deletions, substitutions and adjacent swaps. */
    static int distance(String a, String b) {
        int n = a.length(), m = b.length();
        int[][] d = new int[n + 1][m + 1];
        for (int i = 0; i <= n; i++) d[i][0] = i;
        for (int j = 0; j <= m; j++) d[0][j] = j;
        for (int i = 1; i <= n; i++) {
            for (int j = 1; j <= m; j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                d[i][j] = Math.min(Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1), d[i - 1][j - 1] + cost);
                if (i > 1 && j > 1 && a.charAt(i - 1) == b.charAt(j - 2) && a.charAt(i - 2) == b.charAt(j - 1)) {
                    d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
                }
            }
        }
        return d[n][m];
    }
}
