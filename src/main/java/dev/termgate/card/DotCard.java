package dev.termgate.card;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;

import java.util.Map;
import java.util.SortedSet;
import java.util.TreeSet;

/**
 * A Graphviz picture of a card's sub-schema: each label a box with its own keys inside, each relationship
 * type a labelled arrow per endpoint pair, each subclass link a dashed arrow with a hollow head pointing at the
 * parent. "Any label" ends and domain-free keys go to one dotted ellipse. Deterministic like the text card.
 */
public final class DotCard {

    private static final String ANY_NODE = "*";

    private DotCard() {}

    public static String render(GraphSchema schema, CardScope scope) {
        StringBuilder sb = new StringBuilder();
        sb.append("digraph card {\n")
                .append("  graph [rankdir=LR, fontname=\"Helvetica\", nodesep=0.3, ranksep=0.6];\n")
                .append("  node [shape=box, fontname=\"Helvetica\", fontsize=10];\n")
                .append("  edge [fontname=\"Helvetica\", fontsize=9];\n");
        Map<String, SortedSet<String>> ownKeys = CardText.ownKeys(schema, scope);
        boolean anyNode = ownKeys.containsKey(CardText.ANY);
        for (String l : scope.labels()) {
            NodeLabel label = schema.labels().get(l);
            if (label == null) continue;
            sb.append("  ").append(id(l)).append(" [label=<")
                    .append(box(schema, l, label.info().deprecated(), ownKeys.getOrDefault(l, new TreeSet<>())))
                    .append('>');
            if (label.info().deprecated()) sb.append(", style=dashed");
            sb.append("];\n");
        }
        StringBuilder edges = new StringBuilder();
        for (String l : scope.labels()) {
            NodeLabel label = schema.labels().get(l);
            if (label == null) continue;
            for (String parent : new TreeSet<>(label.superLabels())) {
                if (!scope.labels().contains(parent)) continue;
                edges.append("  ").append(id(l)).append(" -> ").append(id(parent))
                        .append(" [style=dashed, arrowhead=onormal, color=gray40];\n");
            }
        }
        for (String r : scope.relTypes()) {
            RelType rel = schema.relTypes().get(r);
            if (rel == null) continue;
            SortedSet<String> lines = new TreeSet<>();
            for (Endpoint e : CardText.shownEndpoints(schema, scope, rel)) {
                if (e.anyFrom() || e.anyTo()) anyNode = true;
                String attrs = "label=" + quote(r) + (rel.symmetric() ? ", dir=both" : "")
                        + (rel.info().deprecated() ? ", style=dashed" : "");
                lines.add("  " + id(e.from() == null ? ANY_NODE : e.from()) + " -> "
                        + id(e.to() == null ? ANY_NODE : e.to()) + " [" + attrs + "];\n");
            }
            lines.forEach(edges::append);
        }
        if (anyNode) {
            sb.append("  ").append(id(ANY_NODE)).append(" [shape=ellipse, style=dotted, label=<")
                    .append(box(schema, "any label", false, ownKeys.getOrDefault(CardText.ANY, new TreeSet<>())))
                    .append(">];\n");
        }
        sb.append(edges).append("}\n");
        return sb.toString();
    }

    private static String box(GraphSchema schema, String title, boolean deprecated, SortedSet<String> keys) {
        StringBuilder sb = new StringBuilder("<B>").append(html(title)).append("</B>");
        if (deprecated) sb.append(" (deprecated)");
        for (String k : keys) {
            PropertyKey key = schema.properties().get(k);
            sb.append("<BR ALIGN=\"LEFT\"/>").append(html(k)).append(": ").append(key.valueType().word());
            if (key.info().deprecated()) sb.append(" (deprecated)");
        }
        if (!keys.isEmpty()) sb.append("<BR ALIGN=\"LEFT\"/>");
        return sb.toString();
    }

    private static String id(String name) {
        return quote(name);
    }

    private static String quote(String s) {
        return '"' + s.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }

    private static String html(String s) {
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }
}
