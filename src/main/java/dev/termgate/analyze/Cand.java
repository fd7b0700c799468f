package dev.termgate.analyze;

import java.util.Collections;
import java.util.HashSet;
import java.util.Set;
import java.util.TreeSet;

/**
 * The classes a node may be an instance of (its most specific class), or {@link #ANY}. Sets larger than
 * {@link #LIMIT} are widened to ANY: that only loses precision (fewer findings, never a false one) and keeps
 * the work per query bounded whatever the ontology's size.
 */
final class Cand {
    /** Common practice: wide enough for every branch of the demo, ORG, FOAF and PROV hierarchies. */
    static final int LIMIT = 256;

    static final Cand ANY = new Cand(null);
    static final Cand NONE = new Cand(Set.of());

    private final Set<String> set;

    private Cand(Set<String> set) {
        this.set = set;
    }

    static Cand of(Set<String> classes) {
        if (classes.size() > LIMIT) return ANY;
        return new Cand(Collections.unmodifiableSet(classes));
    }

    boolean any() {
        return set == null;
    }

    boolean empty() {
        return set != null && set.isEmpty();
    }

    Set<String> classes() {
        return set == null ? Set.of() : set;
    }

    Cand and(Cand o) {
        if (any()) return o;
        if (o.any()) return this;
        Set<String> small = set.size() <= o.set.size() ? set : o.set;
        Set<String> big = small == set ? o.set : set;
        if (big.containsAll(small)) return small == set ? this : o;
        Set<String> out = new HashSet<>();
        for (String s : small) if (big.contains(s)) out.add(s);
        return new Cand(Collections.unmodifiableSet(out));
    }

    Cand or(Cand o) {
        if (any() || o.any()) return ANY;
        if (set.containsAll(o.set)) return this;
        if (o.set.containsAll(set)) return o;
        Set<String> out = new HashSet<>(set);
        out.addAll(o.set);
        return of(out);
    }

    boolean intersects(Cand o) {
        if (any() || o.any()) return true;
        Set<String> small = set.size() <= o.set.size() ? set : o.set;
        Set<String> big = small == set ? o.set : set;
        for (String s : small) if (big.contains(s)) return true;
        return false;
    }

    boolean sameAs(Cand o) {
        if (any() || o.any()) return any() == o.any();
        return set.equals(o.set);
    }

    @Override
    public String toString() {
        return any() ? "ANY" : new TreeSet<>(set).toString();
    }
}
