package dev.termgate.diag;

import java.util.List;
import java.util.stream.Collectors;

/** How names appear inside messages, kept in one place so every message quotes alike. */
public final class Quote {
    private Quote() {}

    public static String name(String s) {
        return "'" + s + "'";
    }

    /** {@code 'A'}, {@code 'A' or 'B'}, {@code 'A', 'B' or 'C'}. */
    public static String orList(List<String> names) {
        return join(names, " or ");
    }

    /** {@code 'A'}, {@code 'A' and 'B'}, {@code 'A', 'B' and 'C'}. */
    public static String andList(List<String> names) {
        return join(names, " and ");
    }

    private static String join(List<String> names, String last) {
        List<String> q = names.stream().map(Quote::name).collect(Collectors.toList());
        if (q.size() <= 1) return String.join("", q);
        return String.join(", ", q.subList(0, q.size() - 1)) + last + q.get(q.size() - 1);
    }
}
