package dev.termgate.graph;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;

/**
 * The storage convention for openCypher labels in a TinkerPop graph, where a vertex has exactly one label.
 *
 * <ul>
 *   <li>a node with one label {@code A} is stored with vertex label {@code A} (so graphs made by other
 *       TinkerPop tools read naturally);</li>
 *   <li>a node with several labels is stored with the labels joined by {@code ::} in the order they were
 *       written, e.g. {@code Vessel::Tanker};</li>
 *   <li>a node with no label is stored with TinkerPop's default label {@code vertex}.</li>
 * </ul>
 * Matching {@code :A} therefore means "any stored vertex label whose parts include A"; the engine keeps the
 * catalogue of stored vertex labels and turns a label test into {@code hasLabel(within(...))}.
 * Relationship types are edge labels unchanged.
 */
public final class LabelCodec {
    public static final String SEPARATOR = "::";
    /** TinkerPop's default vertex label stands for "no label". */
    public static final String NO_LABEL = "vertex";

    private LabelCodec() {}

    public static String encode(List<String> labels) {
        List<String> distinct = new ArrayList<>(new LinkedHashSet<>(labels));
        if (distinct.isEmpty()) return NO_LABEL;
        for (String l : distinct) {
            if (l.isEmpty() || l.contains(SEPARATOR)) {
                throw new IllegalArgumentException("label '" + l + "' cannot be stored (empty or contains '::')");
            }
        }
        return String.join(SEPARATOR, distinct);
    }

    public static List<String> decode(String vertexLabel) {
        if (vertexLabel == null || vertexLabel.equals(NO_LABEL) || vertexLabel.isEmpty()) return List.of();
        if (!vertexLabel.contains(SEPARATOR)) return List.of(vertexLabel);
        return List.of(vertexLabel.split(SEPARATOR, -1));
    }
}
