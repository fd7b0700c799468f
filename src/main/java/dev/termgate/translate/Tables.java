package dev.termgate.translate;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;

/** Rows as a text table or CSV (RFC 4180 quoting). */
public final class Tables {

    /** Wider cells are cut so a long text value does not wreck the table. */
    static final int MAX_CELL = 60;

    private Tables() {}

    public static String text(List<String> columns, List<List<Object>> rows) {
        List<List<String>> cells = new ArrayList<>();
        for (List<Object> r : rows) cells.add(r.stream().map(Tables::cell).toList());
        int[] w = new int[columns.size()];
        for (int i = 0; i < w.length; i++) {
            w[i] = columns.get(i).length();
            for (List<String> r : cells) if (i < r.size()) w[i] = Math.max(w[i], r.get(i).length());
        }
        StringBuilder sb = new StringBuilder();
        line(sb, columns, w);
        StringBuilder rule = new StringBuilder();
        for (int i = 0; i < w.length; i++) rule.append(i == 0 ? "" : "-+-").append("-".repeat(w[i]));
        sb.append(rule).append('\n');
        for (List<String> r : cells) line(sb, r, w);
        return sb.toString();
    }

    private static void line(StringBuilder sb, List<String> values, int[] w) {
        StringBuilder l = new StringBuilder();
        for (int i = 0; i < w.length; i++) {
            String v = i < values.size() ? values.get(i) : "";
            l.append(i == 0 ? "" : " | ").append(v).append(" ".repeat(w[i] - v.length()));
        }
        sb.append(l.toString().stripTrailing()).append('\n');
    }

    static String cell(Object v) {
        String s = show(v).replace('\n', ' ').replace('\r', ' ');
        return s.length() > MAX_CELL ? s.substring(0, MAX_CELL - 1) + "…" : s;
    }

    /** openCypher-like literal form: strings bare at top level, quoted inside lists and maps. */
    static String show(Object v) {
        if (v == null) return "null";
        if (v instanceof List<?> l) return l.stream().map(Tables::inner).collect(Collectors.joining(", ", "[", "]"));
        if (v instanceof Map<?, ?> m) return m.entrySet().stream().map(e -> e.getKey() + ": " + inner(e.getValue()))
                .collect(Collectors.joining(", ", "{", "}"));
        return String.valueOf(v);
    }

    private static String inner(Object v) {
        return v instanceof String s ? "'" + s.replace("'", "\\'") + "'" : show(v);
    }

    public static String csv(List<String> columns, List<List<Object>> rows) {
        StringBuilder sb = new StringBuilder();
        sb.append(columns.stream().map(Tables::csvCell).collect(Collectors.joining(","))).append('\n');
        for (List<Object> r : rows) {
            sb.append(r.stream().map(v -> csvCell(v == null ? "" : show(v))).collect(Collectors.joining(","))).append('\n');
        }
        return sb.toString();
    }

    private static String csvCell(String s) {
        return s.contains(",") || s.contains("\"") || s.contains("\n") || s.contains("\r")
                ? "\"" + s.replace("\"", "\"\"") + "\"" : s;
    }
}
