package dev.termgate.engine;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Reads values written in the openCypher TCK's result notation (nodes {@code (:A {k: 1})}, relationships
 * {@code [:T]}, paths {@code <(:A)-[:T]->()>}, lists, maps, strings in single quotes) and renders both those
 * and engine results in one canonical text, so that a cell compares by string equality. Labels and map keys
 * are sorted; integers and floats stay distinct (the TCK tells 1 from 1.0).
 */
final class TckValues {
    private TckValues() {}

    /** A path as the TCK writes it: each relationship with its written direction. */
    record ExpectedPath(List<NodeValue> nodes, List<RelValue> rels, List<Boolean> forward) {}

    static Object parse(String text) {
        Reader r = new Reader(text.strip());
        Object v = r.value();
        r.ws();
        if (r.i != r.s.length()) throw new IllegalArgumentException("trailing text in TCK value: " + text);
        return v;
    }

    static String canon(Object v, boolean ignoreListOrder) {
        StringBuilder sb = new StringBuilder();
        canon(sb, v, ignoreListOrder);
        return sb.toString();
    }

    private static void canon(StringBuilder sb, Object v, boolean unordered) {
        if (v == null) sb.append("null");
        else if (v instanceof String s) sb.append('\'').append(s.replace("\\", "\\\\").replace("'", "\\'")).append('\'');
        else if (v instanceof Double d) sb.append(canonFloat(d));
        else if (v instanceof Long || v instanceof Boolean) sb.append(v);
        else if (Temporals.isTemporal(v)) canon(sb, Temporals.text(v), unordered);
        else if (v instanceof List<?> l) {
            List<String> parts = new ArrayList<>();
            for (Object o : l) parts.add(canon(o, unordered));
            if (unordered) java.util.Collections.sort(parts);
            sb.append('[').append(String.join(", ", parts)).append(']');
        } else if (v instanceof Map<?, ?> m) {
            sb.append('{');
            props(sb, m, unordered);
            sb.append('}');
        } else if (v instanceof NodeValue n) {
            sb.append('(');
            n.labels().stream().sorted().forEach(l -> sb.append(':').append(l));
            if (!n.properties().isEmpty()) {
                if (!n.labels().isEmpty()) sb.append(' ');
                sb.append('{');
                props(sb, n.properties(), unordered);
                sb.append('}');
            }
            sb.append(')');
        } else if (v instanceof RelValue r) {
            sb.append("[:").append(r.type());
            if (!r.properties().isEmpty()) {
                sb.append(" {");
                props(sb, r.properties(), unordered);
                sb.append('}');
            }
            sb.append(']');
        } else if (v instanceof ExpectedPath p) {
            path(sb, p.nodes(), p.rels(), p.forward(), unordered);
        } else if (v instanceof PathValue p) {
            List<Boolean> fwd = new ArrayList<>();
            for (int i = 0; i < p.rels().size(); i++) {
                fwd.add(String.valueOf(Values.normalize(p.rels().get(i).start()))
                        .equals(String.valueOf(Values.normalize(p.nodes().get(i).id()))));
            }
            path(sb, p.nodes(), p.rels(), fwd, unordered);
        } else sb.append(v);
    }

    private static void path(StringBuilder sb, List<NodeValue> nodes, List<RelValue> rels, List<Boolean> fwd, boolean u) {
        sb.append('<');
        canon(sb, nodes.get(0), u);
        for (int i = 0; i < rels.size(); i++) {
            sb.append(fwd.get(i) ? "-" : "<-");
            canon(sb, rels.get(i), u);
            sb.append(fwd.get(i) ? "->" : "-");
            canon(sb, nodes.get(i + 1), u);
        }
        sb.append('>');
    }

    private static void props(StringBuilder sb, Map<?, ?> m, boolean u) {
        TreeMap<String, Object> sorted = new TreeMap<>();
        m.forEach((k, x) -> sorted.put(String.valueOf(k), x));
        boolean first = true;
        for (var e : sorted.entrySet()) {
            if (!first) sb.append(", ");
            first = false;
            sb.append(e.getKey()).append(": ");
            canon(sb, e.getValue(), u);
        }
    }

    static String canonFloat(double d) {
        if (Double.isNaN(d)) return "NaN";
        if (Double.isInfinite(d)) return d > 0 ? "Infinity" : "-Infinity";
        if (d == 0) return "0.0";
        // Twelve significant digits: the TCK writes floats as its reference engine prints them.
        java.math.BigDecimal b = new java.math.BigDecimal(d).round(new java.math.MathContext(12));
        return b.stripTrailingZeros().toString();
    }

    private static final class Reader {
        final String s;
        int i;

        Reader(String s) {
            this.s = s;
        }

        void ws() {
            while (i < s.length() && Character.isWhitespace(s.charAt(i))) i++;
        }

        boolean peek(String t) {
            ws();
            return s.startsWith(t, i);
        }

        void expect(String t) {
            ws();
            if (!s.startsWith(t, i)) throw new IllegalArgumentException("expected '" + t + "' at " + i + " in " + s);
            i += t.length();
        }

        Object value() {
            ws();
            char c = s.charAt(i);
            if (c == '\'' || c == '"') return string();
            if (c == '[') return peekRel() ? rel() : list();
            if (c == '{') return map();
            if (c == '(') return node();
            if (c == '<') return path();
            if (s.startsWith("null", i)) { i += 4; return null; }
            if (s.startsWith("true", i)) { i += 4; return true; }
            if (s.startsWith("false", i)) { i += 5; return false; }
            if (s.startsWith("NaN", i)) { i += 3; return Double.NaN; }
            if (s.startsWith("Infinity", i)) { i += 8; return Double.POSITIVE_INFINITY; }
            if (s.startsWith("-Infinity", i)) { i += 9; return Double.NEGATIVE_INFINITY; }
            return number();
        }

        boolean peekRel() {
            int j = i + 1;
            while (j < s.length() && Character.isWhitespace(s.charAt(j))) j++;
            return j < s.length() && s.charAt(j) == ':';
        }

        Object number() {
            int start = i;
            if (s.charAt(i) == '-' || s.charAt(i) == '+') i++;
            boolean flt = false;
            boolean hex = s.startsWith("0x", i) || s.startsWith("0o", i);
            while (i < s.length()) {
                char c = s.charAt(i);
                if (Character.isDigit(c) || (hex && Character.isLetterOrDigit(c))) i++;
                else if (c == '.' || c == 'e' || c == 'E') { flt = true; i++; }
                else if ((c == '-' || c == '+') && (s.charAt(i - 1) == 'e' || s.charAt(i - 1) == 'E')) i++;
                else break;
            }
            String t = s.substring(start, i);
            if (t.isEmpty() || t.equals("-")) throw new IllegalArgumentException("not a TCK value at " + start + ": " + s);
            if (flt) return Double.parseDouble(t);
            return Long.parseLong(t);
        }

        String string() {
            char q = s.charAt(i++);
            StringBuilder sb = new StringBuilder();
            while (s.charAt(i) != q) {
                char c = s.charAt(i++);
                if (c == '\\') {
                    char e = s.charAt(i++);
                    switch (e) {
                        case 'n' -> sb.append('\n');
                        case 't' -> sb.append('\t');
                        case 'r' -> sb.append('\r');
                        case 'u' -> { sb.append((char) Integer.parseInt(s.substring(i, i + 4), 16)); i += 4; }
                        default -> sb.append(e);
                    }
                } else sb.append(c);
            }
            i++;
            return sb.toString();
        }

        List<Object> list() {
            expect("[");
            List<Object> out = new ArrayList<>();
            if (peek("]")) { i++; return out; }
            do {
                out.add(value());
                ws();
            } while (s.charAt(i++) == ',');
            if (s.charAt(i - 1) != ']') throw new IllegalArgumentException("bad list in " + s);
            return out;
        }

        Map<String, Object> map() {
            expect("{");
            Map<String, Object> out = new LinkedHashMap<>();
            if (peek("}")) { i++; return out; }
            do {
                String key = name();
                expect(":");
                out.put(key, value());
                ws();
            } while (s.charAt(i++) == ',');
            if (s.charAt(i - 1) != '}') throw new IllegalArgumentException("bad map in " + s);
            return out;
        }

        String name() {
            ws();
            if (s.charAt(i) == '`') {
                int j = s.indexOf('`', i + 1);
                String n = s.substring(i + 1, j);
                i = j + 1;
                return n;
            }
            int start = i;
            while (i < s.length() && (Character.isLetterOrDigit(s.charAt(i)) || s.charAt(i) == '_')) i++;
            return s.substring(start, i);
        }

        NodeValue node() {
            expect("(");
            List<String> labels = new ArrayList<>();
            while (peek(":")) { i++; labels.add(name()); }
            Map<String, Object> props = peek("{") ? map() : Map.of();
            expect(")");
            return new NodeValue(null, labels, props);
        }

        RelValue rel() {
            expect("[");
            expect(":");
            String type = name();
            Map<String, Object> props = peek("{") ? map() : Map.of();
            expect("]");
            return new RelValue(null, type, null, null, props);
        }

        ExpectedPath path() {
            expect("<");
            List<NodeValue> nodes = new ArrayList<>();
            List<RelValue> rels = new ArrayList<>();
            List<Boolean> fwd = new ArrayList<>();
            nodes.add(node());
            while (!peek(">")) {
                boolean back = peek("<-");
                expect(back ? "<-" : "-");
                rels.add(rel());
                expect(back ? "-" : "->");
                fwd.add(!back);
                nodes.add(node());
            }
            expect(">");
            return new ExpectedPath(nodes, rels, fwd);
        }
    }
}
