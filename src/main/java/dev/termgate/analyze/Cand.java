package dev.termgate.analyze;

import java.util.Arrays;
import java.util.LinkedHashSet;
import java.util.Set;
import java.util.TreeSet;

/**
 * The classes a node may be an instance of (its most specific class), or {@link #ANY}. Sets larger than
 * {@link #LIMIT} are widened to ANY: that only loses precision (fewer findings, never a false one) and keeps
 * the work per query bounded whatever the ontology's size.
 *
 * <p>A set is a sorted array of the class ids {@link SchemaIndex} gives each label, so intersecting two sets is
 * one merge over at most 2 × {@code LIMIT} integers, with no hashing or string comparison; the id table turns
 * ids back into names only for messages.
 */
final class Cand {
    /** Common practice: wide enough for every branch of the demo, ORG, FOAF and PROV hierarchies. */
    static final int LIMIT = 256;

    private static final int[] EMPTY = new int[0];

    static final Cand ANY = new Cand(null, null);
    static final Cand NONE = new Cand(EMPTY, null);

    /** Sorted, distinct class ids; null for ANY. */
    private final int[] ids;
    /** id → label name, shared by every set of one schema; null for ANY and NONE. */
    private final String[] names;

    private Cand(int[] ids, String[] names) {
        this.ids = ids;
        this.names = names;
    }

    /** The set of the given ids (sorted and distinct, the caller's array is taken over); ANY past the limit. */
    static Cand of(int[] sortedIds, String[] names) {
        if (sortedIds.length > LIMIT) return ANY;
        if (sortedIds.length == 0) return NONE;
        return new Cand(sortedIds, names);
    }

    boolean any() {
        return ids == null;
    }

    boolean empty() {
        return ids != null && ids.length == 0;
    }

    /** How many classes; 0 for ANY (ask {@link #any()} first). */
    int size() {
        return ids == null ? 0 : ids.length;
    }

    /** Whether the class id is in the set (false for ANY: ask {@link #any()} first). */
    boolean holds(int id) {
        return ids != null && Arrays.binarySearch(ids, id) >= 0;
    }

    /** The class names, for messages. */
    Set<String> classes() {
        if (ids == null || ids.length == 0) return Set.of();
        Set<String> out = new LinkedHashSet<>();
        for (int id : ids) out.add(names[id]);
        return out;
    }

    Cand and(Cand o) {
        if (any()) return o;
        if (o.any() || ids == o.ids) return this;
        int[] a = ids, b = o.ids;
        int[] out = new int[Math.min(a.length, b.length)];
        int n = 0;
        for (int i = 0, j = 0; i < a.length && j < b.length; ) {
            if (a[i] < b[j]) i++;
            else if (a[i] > b[j]) j++;
            else {
                out[n++] = a[i];
                i++;
                j++;
            }
        }
        // keep an operand when it is the result, so repeated narrowing allocates nothing and sameAs is cheap
        if (n == a.length) return this;
        if (n == b.length) return o;
        return n == 0 ? NONE : new Cand(Arrays.copyOf(out, n), names());
    }

    Cand or(Cand o) {
        if (any() || o.any()) return ANY;
        if (ids == o.ids || o.ids.length == 0) return this;
        if (ids.length == 0) return o;
        int[] a = ids, b = o.ids;
        int[] out = new int[a.length + b.length];
        int n = 0, i = 0, j = 0;
        while (i < a.length && j < b.length) {
            if (a[i] < b[j]) out[n++] = a[i++];
            else if (a[i] > b[j]) out[n++] = b[j++];
            else {
                out[n++] = a[i++];
                j++;
            }
        }
        while (i < a.length) out[n++] = a[i++];
        while (j < b.length) out[n++] = b[j++];
        if (n == a.length) return this;
        if (n == b.length) return o;
        return of(Arrays.copyOf(out, n), names());
    }

    boolean intersects(Cand o) {
        if (any() || o.any()) return true;
        int[] a = ids, b = o.ids;
        if (a == b) return a.length > 0;
        if (a.length > b.length) {
            int[] t = a;
            a = b;
            b = t;
        }
        if (a.length * 8 < b.length) {
            // a few classes against a wide hierarchy: look each up rather than scan the wide one
            for (int id : a) if (Arrays.binarySearch(b, id) >= 0) return true;
            return false;
        }
        for (int i = 0, j = 0; i < a.length && j < b.length; ) {
            if (a[i] < b[j]) i++;
            else if (a[i] > b[j]) j++;
            else return true;
        }
        return false;
    }

    boolean sameAs(Cand o) {
        if (any() || o.any()) return any() == o.any();
        return ids == o.ids || Arrays.equals(ids, o.ids);
    }

    private String[] names() {
        return names;
    }

    @Override
    public String toString() {
        return any() ? "ANY" : new TreeSet<>(classes()).toString();
    }
}
