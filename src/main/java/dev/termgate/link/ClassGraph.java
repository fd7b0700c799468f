package dev.termgate.link;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.RelType;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collection;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.PriorityQueue;
import java.util.Set;
import java.util.function.ToDoubleFunction;

/**
 * The class graph of a schema: classes as nodes, subclass links, and one edge per declared (domain, range)
 * pair of each relationship type. Used to connect the classes a question names with the fewest extra terms
 * and to find the most central classes. Immutable and thread-safe after construction.
 *
 * <p>A path may climb from a class to its superclasses (a Movie can use the relationships of CreativeWork),
 * cross a relationship, and descend to a subclass after crossing one; climbing and then descending with no
 * relationship in between is not a connection (Movie and Person merely share the ancestor Thing), so the
 * search keeps whether it has just climbed.
 */
final class ClassGraph {

    /** One step of a connecting path. {@code relType} is null for subclass steps. */
    record Step(String from, String to, String relType) {}

    // Costs (common practice: a subclass step is cheaper than a relationship, so inherited relationships are
    // used, but a relationship the question names is preferred over a detour through the hierarchy).
    static final double SUBCLASS_STEP = 0.3;
    private static final double GENERIC_PENALTY = 0.6;

    private final List<String> names = new ArrayList<>();
    private final Map<String, Integer> ids = new HashMap<>();
    private final int[][] up;
    private final int[][] down;
    private final int[][] relTo;
    private final int[][] relId;
    private final double[][] relPenalty;
    private final List<String> relNames = new ArrayList<>();
    private final Map<String, Integer> relIds = new HashMap<>();
    private volatile double[] pageRank;

    ClassGraph(GraphSchema schema) {
        for (String l : schema.labels().keySet()) {
            ids.put(l, names.size());
            names.add(l);
        }
        int n = names.size();
        List<Set<Integer>> ups = lists(n);
        List<Set<Integer>> downs = lists(n);
        for (NodeLabel l : schema.labels().values()) {
            int i = ids.get(l.name());
            for (String s : union(l.superLabels(), l.equivalents())) {
                Integer j = ids.get(s);
                if (j == null || j == i) continue;
                ups.get(i).add(j);
                downs.get(j).add(i);
            }
            for (String e : l.equivalents()) {
                Integer j = ids.get(e);
                if (j == null || j == i) continue;
                ups.get(j).add(i);
                downs.get(i).add(j);
            }
        }
        double[] genericity = new double[n];
        double logN = Math.log(1 + n);
        for (int i = 0; i < n; i++) {
            genericity[i] = logN == 0 ? 0 : Math.log(schema.subLabels(names.get(i)).size()) / logN;
        }
        // Edges as (target, relationship id); both directions, since a pattern may be written either way.
        List<List<int[]>> rels = new ArrayList<>();
        for (int i = 0; i < n; i++) rels.add(new ArrayList<>());
        for (RelType r : schema.relTypes().values()) {
            int rid = relNames.size();
            relIds.put(r.name(), rid);
            relNames.add(r.name());
            Set<Long> seen = new java.util.HashSet<>();
            for (Endpoint e : schema.effectiveEndpoints(r.name())) {
                if (e.anyFrom() || e.anyTo()) continue;
                Integer a = ids.get(e.from());
                Integer b = ids.get(e.to());
                if (a == null || b == null || !seen.add(((long) a << 32) | b)) continue;
                rels.get(a).add(new int[] {b, rid});
                if (!a.equals(b)) rels.get(b).add(new int[] {a, rid});
            }
        }
        up = toArrays(ups);
        down = toArrays(downs);
        relTo = new int[n][];
        relId = new int[n][];
        relPenalty = new double[n][];
        for (int i = 0; i < n; i++) {
            List<int[]> es = rels.get(i);
            relTo[i] = new int[es.size()];
            relId[i] = new int[es.size()];
            relPenalty[i] = new double[es.size()];
            for (int k = 0; k < es.size(); k++) {
                relTo[i][k] = es.get(k)[0];
                relId[i][k] = es.get(k)[1];
                relPenalty[i][k] = GENERIC_PENALTY * Math.pow(Math.max(genericity[i], genericity[es.get(k)[0]]), 3);
            }
        }
    }

    boolean contains(String label) {
        return ids.containsKey(label);
    }

    /**
     * The cheapest path from any class of {@code tree} to {@code target}, or empty when none exists within
     * {@code maxCost}. {@code relCost} gives each relationship type's own cost (lower for types the question
     * names); a penalty is added for relationships declared on very general classes, which connect everything
     * and say little.
     */
    Optional<List<Step>> connect(Collection<String> tree, String target, ToDoubleFunction<String> relCost,
                                 double maxCost) {
        Integer goal = ids.get(target);
        if (goal == null) return Optional.empty();
        int n = names.size();
        // State = node * 2 + mode; mode 0 = may descend, mode 1 = has just climbed (may not descend).
        double[] dist = new double[2 * n];
        int[] prev = new int[2 * n];
        String[] via = new String[2 * n];
        Arrays.fill(dist, Double.POSITIVE_INFINITY);
        Arrays.fill(prev, -1);
        PriorityQueue<double[]> queue = new PriorityQueue<>(Comparator.comparingDouble(a -> a[0]));
        for (String t : tree) {
            Integer i = ids.get(t);
            if (i == null) continue;
            if (i.equals(goal)) return Optional.of(List.of());
            dist[2 * i] = 0;
            queue.add(new double[] {0, 2 * i});
        }
        double[] relCosts = new double[relNames.size()];
        Arrays.fill(relCosts, Double.NaN);
        while (!queue.isEmpty()) {
            double[] top = queue.poll();
            int s = (int) top[1];
            if (top[0] > dist[s]) continue;
            if (top[0] > maxCost) break;
            int node = s / 2;
            int mode = s % 2;
            if (node == goal) return Optional.of(path(s, prev, via));
            for (int j : up[node]) relax(queue, dist, prev, via, s, 2 * j + 1, top[0] + SUBCLASS_STEP, null);
            if (mode == 0) {
                for (int j : down[node]) relax(queue, dist, prev, via, s, 2 * j, top[0] + SUBCLASS_STEP, null);
            }
            for (int k = 0; k < relTo[node].length; k++) {
                int r = relId[node][k];
                double rc = relCosts[r];
                if (Double.isNaN(rc)) rc = relCosts[r] = relCost.applyAsDouble(relNames.get(r));
                relax(queue, dist, prev, via, s, 2 * relTo[node][k], top[0] + rc + relPenalty[node][k], relNames.get(r));
            }
        }
        return Optional.empty();
    }

    private static void relax(PriorityQueue<double[]> queue, double[] dist, int[] prev, String[] via, int from,
                              int to, double d, String rel) {
        if (d < dist[to]) {
            dist[to] = d;
            prev[to] = from;
            via[to] = rel;
            queue.add(new double[] {d, to});
        }
    }

    private List<Step> path(int end, int[] prev, String[] via) {
        List<Step> steps = new ArrayList<>();
        for (int s = end; prev[s] >= 0; s = prev[s]) {
            steps.add(0, new Step(names.get(prev[s] / 2), names.get(s / 2), via[s]));
        }
        return steps;
    }

    /** The {@code k} classes with the highest PageRank over the undirected class graph. */
    List<String> central(int k) {
        double[] pr = pageRank();
        Integer[] order = new Integer[pr.length];
        for (int i = 0; i < order.length; i++) order[i] = i;
        Arrays.sort(order, Comparator.comparingDouble((Integer i) -> -pr[i]).thenComparing(names::get));
        List<String> out = new ArrayList<>();
        for (int i = 0; i < Math.min(k, order.length); i++) out.add(names.get(order[i]));
        return out;
    }

    double pageRankOf(String label) {
        Integer i = ids.get(label);
        return i == null ? 0 : pageRank()[i];
    }

    private double[] pageRank() {
        double[] pr = pageRank;
        if (pr != null) return pr;
        int n = names.size();
        pr = new double[n];
        if (n == 0) return pageRank = pr;
        int[][] adj = new int[n][];
        for (int i = 0; i < n; i++) {
            int[] a = new int[up[i].length + down[i].length + relTo[i].length];
            System.arraycopy(up[i], 0, a, 0, up[i].length);
            System.arraycopy(down[i], 0, a, up[i].length, down[i].length);
            System.arraycopy(relTo[i], 0, a, up[i].length + down[i].length, relTo[i].length);
            adj[i] = a;
        }
        // Standard PageRank, damping 0.85 (the usual value, from memory); dangling mass spread evenly.
        double d = 0.85;
        Arrays.fill(pr, 1.0 / n);
        for (int it = 0; it < 50; it++) {
            double[] next = new double[n];
            double dangling = 0;
            for (int i = 0; i < n; i++) {
                if (adj[i].length == 0) {
                    dangling += pr[i];
                    continue;
                }
                double share = pr[i] / adj[i].length;
                for (int j : adj[i]) next[j] += share;
            }
            for (int i = 0; i < n; i++) next[i] = (1 - d) / n + d * (next[i] + dangling / n);
            pr = next;
        }
        pageRank = pr;
        return pr;
    }

    private static Set<String> union(Set<String> a, Set<String> b) {
        Set<String> s = new LinkedHashSet<>(a);
        s.addAll(b);
        return s;
    }

    private static List<Set<Integer>> lists(int n) {
        List<Set<Integer>> l = new ArrayList<>(n);
        for (int i = 0; i < n; i++) l.add(new LinkedHashSet<>());
        return l;
    }

    private static int[][] toArrays(List<Set<Integer>> l) {
        int[][] out = new int[l.size()][];
        for (int i = 0; i < l.size(); i++) out[i] = l.get(i).stream().mapToInt(Integer::intValue).toArray();
        return out;
    }
}
