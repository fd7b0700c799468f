package dev.termgate.engine;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import com.google.gson.JsonPrimitive;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/** Renders results as a terminal table, JSON or CSV. */
public final class ResultFormat {
    private static final Gson GSON = new GsonBuilder().disableHtmlEscaping().serializeNulls().create();
    private static final int MAX_CELL = 60;

    private ResultFormat() {}

    /** A boxed table; a truncated result says so below the table. */
    public static String table(Result r) {
        List<String> cols = r.columns();
        List<List<String>> cells = new ArrayList<>();
        int[] width = new int[cols.size()];
        for (int i = 0; i < cols.size(); i++) width[i] = cols.get(i).length();
        for (List<Object> row : r.rows()) {
            List<String> line = new ArrayList<>();
            for (int i = 0; i < cols.size(); i++) {
                String s = Values.display(row.get(i)).replace('\n', ' ');
                if (s.length() > MAX_CELL) s = s.substring(0, MAX_CELL - 1) + "…";
                line.add(s);
                width[i] = Math.max(width[i], s.length());
            }
            cells.add(line);
        }
        StringBuilder sb = new StringBuilder();
        String rule = rule(width);
        sb.append(rule);
        sb.append(line(cols, width));
        sb.append(rule);
        for (List<String> line : cells) sb.append(line(line, width));
        if (!cells.isEmpty()) sb.append(rule);
        sb.append(footer(r)).append('\n');
        return sb.toString();
    }

    /** The line below a table: the row count, and the truncation marker when the row cap cut the result. */
    public static String footer(Result r) {
        int n = r.rows().size();
        String time = String.format(java.util.Locale.ROOT, "%.1f ms", (r.compileNanos() + r.runNanos()) / 1e6);
        if (r.truncated()) {
            return "TRUNCATED: showing the first " + n + " rows only; there are more (raise --max-rows) (" + time + ")";
        }
        return "(" + n + (n == 1 ? " row, " : " rows, ") + time + ")";
    }

    private static String rule(int[] width) {
        StringBuilder sb = new StringBuilder("+");
        for (int w : width) sb.append("-".repeat(w + 2)).append('+');
        return sb.append('\n').toString();
    }

    private static String line(List<String> cells, int[] width) {
        StringBuilder sb = new StringBuilder("|");
        for (int i = 0; i < width.length; i++) {
            String c = cells.get(i);
            sb.append(' ').append(c).append(" ".repeat(width[i] - c.length())).append(" |");
        }
        return sb.append('\n').toString();
    }

    /** {@code {"columns": [...], "rows": [[...]], "truncated": false, "rowCount": n, "elapsedMs": t}}. */
    public static JsonObject json(Result r) {
        JsonObject o = new JsonObject();
        JsonArray cols = new JsonArray();
        r.columns().forEach(cols::add);
        o.add("columns", cols);
        JsonArray rows = new JsonArray();
        for (List<Object> row : r.rows()) {
            JsonArray a = new JsonArray();
            for (Object v : row) a.add(toJson(v));
            rows.add(a);
        }
        o.add("rows", rows);
        o.addProperty("truncated", r.truncated());
        o.addProperty("rowCount", r.rows().size());
        o.addProperty("elapsedMs", Math.round((r.compileNanos() + r.runNanos()) / 1e4) / 100.0);
        return o;
    }

    public static String jsonText(Result r) {
        return GSON.toJson(json(r));
    }

    /** Values as JSON; nodes, relationships and paths as objects. */
    public static JsonElement toJson(Object v) {
        if (v == null) return JsonNull.INSTANCE;
        if (v instanceof Boolean b) return new JsonPrimitive(b);
        if (v instanceof Long l) return new JsonPrimitive(l);
        if (v instanceof Double d) return d.isNaN() || d.isInfinite() ? new JsonPrimitive(Values.formatFloat(d)) : new JsonPrimitive(d);
        if (v instanceof String s) return new JsonPrimitive(s);
        if (v instanceof List<?> l) {
            JsonArray a = new JsonArray();
            for (Object o : l) a.add(toJson(o));
            return a;
        }
        if (v instanceof Map<?, ?> m) {
            JsonObject o = new JsonObject();
            m.forEach((k, x) -> o.add(String.valueOf(k), toJson(x)));
            return o;
        }
        if (v instanceof NodeValue n) {
            JsonObject o = new JsonObject();
            o.add("id", toJson(Values.normalize(n.id())));
            JsonArray labels = new JsonArray();
            n.labels().forEach(labels::add);
            o.add("labels", labels);
            o.add("properties", toJson(n.properties()));
            return o;
        }
        if (v instanceof RelValue r) {
            JsonObject o = new JsonObject();
            o.add("id", toJson(Values.normalize(r.id())));
            o.addProperty("type", r.type());
            o.add("start", toJson(Values.normalize(r.start())));
            o.add("end", toJson(Values.normalize(r.end())));
            o.add("properties", toJson(r.properties()));
            return o;
        }
        if (v instanceof PathValue p) {
            JsonObject o = new JsonObject();
            o.add("nodes", toJson(new ArrayList<Object>(p.nodes())));
            o.add("relationships", toJson(new ArrayList<Object>(p.rels())));
            return o;
        }
        return new JsonPrimitive(Values.display(v));
    }

    /** RFC 4180 CSV: a header line, then one line per row; collections in their literal form. */
    public static String csv(Result r) {
        StringBuilder sb = new StringBuilder();
        List<String> header = new ArrayList<>(r.columns());
        sb.append(String.join(",", header.stream().map(ResultFormat::csvCell).toList())).append("\r\n");
        for (List<Object> row : r.rows()) {
            List<String> cells = new ArrayList<>();
            for (Object v : row) cells.add(v == null ? "" : csvCell(Values.display(v)));
            sb.append(String.join(",", cells)).append("\r\n");
        }
        return sb.toString();
    }

    private static String csvCell(String s) {
        if (s.contains(",") || s.contains("\"") || s.contains("\n") || s.contains("\r")) {
            return "\"" + s.replace("\"", "\"\"") + "\"";
        }
        return s;
    }
}
