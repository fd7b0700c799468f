package dev.termgate.graph;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * CSV node and relationship files with a header row (RFC 4180 quoting). termgate's header convention:
 *
 * <ul>
 *   <li>a <b>node file</b> has a column {@code @node} (an id, unique across all node files) and optionally
 *       {@code @labels} (labels separated by {@code ;});</li>
 *   <li>a <b>relationship file</b> has the columns {@code @from}, {@code @to} (node ids) and {@code @type};</li>
 *   <li>every other column is a property: {@code key} (text) or {@code key|TYPE} with TYPE one of
 *       {@code string}, {@code int}, {@code float}, {@code bool}, or a list {@code string[]}, {@code int[]},
 *       {@code float[]}, {@code bool[]} (items separated by {@code ;}). An empty cell means "no property".</li>
 * </ul>
 * Node files are read before relationship files whatever order they are given in. A value that does not
 * fit its column type stops the import with the file, line and column.
 */
public final class CsvImport {
    private final GraphBuilder builder;
    private final Map<String, Object> ids = new HashMap<>();

    public CsvImport(GraphBuilder builder) {
        this.builder = builder;
    }

    /** Reads the files (node files first). */
    public void load(List<Path> files) {
        List<Path> nodeFiles = new ArrayList<>();
        List<Path> relFiles = new ArrayList<>();
        for (Path f : files) {
            List<String> header = header(f);
            if (header.contains("@node")) nodeFiles.add(f);
            else if (header.contains("@from") && header.contains("@to") && header.contains("@type")) relFiles.add(f);
            else throw new ImportException(f + ": the header has neither @node nor @from/@to/@type");
        }
        for (Path f : nodeFiles) read(f, true);
        for (Path f : relFiles) read(f, false);
    }

    private static List<String> header(Path f) {
        try (BufferedReader r = Files.newBufferedReader(f, StandardCharsets.UTF_8)) {
            List<String> h = record(r);
            if (h == null) throw new ImportException(f + ": the file is empty");
            return h;
        } catch (IOException e) {
            throw new ImportException("cannot read " + f + ": " + e.getMessage(), e);
        }
    }

    private record Column(int index, String key, String type, boolean list) {}

    private void read(Path f, boolean nodes) {
        try (BufferedReader r = Files.newBufferedReader(f, StandardCharsets.UTF_8)) {
            List<String> header = record(r);
            List<Column> props = new ArrayList<>();
            Map<String, Integer> special = new HashMap<>();
            for (int i = 0; i < header.size(); i++) {
                String h = header.get(i).strip();
                if (h.startsWith("@")) {
                    special.put(h, i);
                    continue;
                }
                String key = h, type = "string";
                int bar = h.lastIndexOf('|');
                if (bar >= 0) {
                    key = h.substring(0, bar);
                    type = h.substring(bar + 1).toLowerCase(Locale.ROOT);
                }
                boolean list = type.endsWith("[]");
                if (list) type = type.substring(0, type.length() - 2);
                if (!List.of("string", "int", "float", "bool").contains(type)) {
                    throw new ImportException(f + ": column '" + h + "' has unknown type '" + type + "'");
                }
                props.add(new Column(i, key, type, list));
            }
            int line = 1;
            List<String> rec;
            while ((rec = record(r)) != null) {
                line++;
                if (rec.size() == 1 && rec.get(0).isEmpty()) continue;
                Map<String, Object> values = new LinkedHashMap<>();
                for (Column c : props) {
                    String cell = c.index() < rec.size() ? rec.get(c.index()) : "";
                    if (cell.isEmpty()) continue;
                    values.put(c.key(), convert(cell, c, f, line));
                }
                if (nodes) {
                    String id = cell(rec, special.get("@node"));
                    if (id.isEmpty()) throw new ImportException(f + ":" + line + ": empty @node id");
                    List<String> labels = new ArrayList<>();
                    Integer li = special.get("@labels");
                    if (li != null) for (String l : cell(rec, li).split(";")) if (!l.isBlank()) labels.add(l.strip());
                    if (ids.containsKey(id)) throw new ImportException(f + ":" + line + ": node id '" + id + "' is used twice");
                    ids.put(id, builder.addNode(labels, values));
                } else {
                    Object from = node(f, line, cell(rec, special.get("@from")));
                    Object to = node(f, line, cell(rec, special.get("@to")));
                    String type = cell(rec, special.get("@type"));
                    if (type.isEmpty()) throw new ImportException(f + ":" + line + ": empty @type");
                    builder.addRelationship(from, to, type, values);
                }
            }
        } catch (IOException e) {
            throw new ImportException("cannot read " + f + ": " + e.getMessage(), e);
        }
    }

    private Object node(Path f, int line, String id) {
        Object v = ids.get(id);
        if (v == null) throw new ImportException(f + ":" + line + ": no node with id '" + id + "'");
        return v;
    }

    private static String cell(List<String> rec, Integer i) {
        return i == null || i >= rec.size() ? "" : rec.get(i);
    }

    private static Object convert(String cell, Column c, Path f, int line) {
        if (!c.list()) return scalar(cell, c, f, line);
        List<Object> out = new ArrayList<>();
        for (String part : cell.split(";", -1)) out.add(scalar(part, c, f, line));
        return out;
    }

    private static Object scalar(String s, Column c, Path f, int line) {
        try {
            return switch (c.type()) {
                case "int" -> Long.parseLong(s.strip());
                case "float" -> Double.parseDouble(s.strip());
                case "bool" -> {
                    String t = s.strip().toLowerCase(Locale.ROOT);
                    if (!t.equals("true") && !t.equals("false")) throw new NumberFormatException();
                    yield Boolean.parseBoolean(t);
                }
                default -> s;
            };
        } catch (NumberFormatException e) {
            throw new ImportException(f + ":" + line + ": column '" + c.key() + "' holds " + c.type()
                    + " values, but the value is '" + s + "'");
        }
    }

    /** One CSV record (fields may hold quoted commas, quotes and line breaks); null at end of input. */
    static List<String> record(BufferedReader r) throws IOException {
        int ch = r.read();
        if (ch < 0) return null;
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        while (true) {
            if (quoted) {
                if (ch < 0) break;
                if (ch == '"') {
                    r.mark(1);
                    int next = r.read();
                    if (next == '"') cur.append('"');
                    else {
                        quoted = false;
                        if (next < 0) break;
                        r.reset();
                    }
                } else cur.append((char) ch);
            } else {
                if (ch < 0 || ch == '\n') break;
                if (ch == '\r') {
                    // CRLF: the \n follows
                } else if (ch == ',') {
                    out.add(cur.toString());
                    cur.setLength(0);
                } else if (ch == '"' && cur.length() == 0) quoted = true;
                else cur.append((char) ch);
            }
            ch = r.read();
        }
        out.add(cur.toString());
        return out;
    }
}
