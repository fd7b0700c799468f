package dev.termgate.link;

import dev.langchain4j.data.segment.TextSegment;
import dev.langchain4j.model.embedding.onnx.allminilml6v2q.AllMiniLmL6V2QuantizedEmbeddingModel;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * Our single-threaded session must embed exactly as the LangChain4j artifact's own model class does (the
 * reference computation: same model file, its default multi-threaded session), or the cached term vectors and the
 * recall figures would silently change.
 */
class MiniLmEmbedderTest {

    private static final List<String> TEXTS = List.of(
            "Which vessels called at a port in the last month?",
            "container",
            "ports where more than three inspections found a prohibited commodity",
            "naïve café — Übersee 42");

    @Test
    void embedsLikeTheArtifactsOwnModel() {
        var reference = new AllMiniLmL6V2QuantizedEmbeddingModel();
        List<float[]> ours = Embedder.miniLm().embedAll(TEXTS);
        for (int i = 0; i < TEXTS.size(); i++) {
            float[] ref = reference.embed(TextSegment.from(TEXTS.get(i))).content().vector().clone();
            Vectors.normalize(ref);
            float[] one = Embedder.miniLm().embed(TEXTS.get(i));
            assertEquals(384, ours.get(i).length);
            for (int d = 0; d < ref.length; d++) {
                // Tolerance: thread count may change the order of float additions inside the runtime (common practice).
                assertEquals(ref[d], ours.get(i)[d], 1e-5, "text " + i + " dimension " + d);
                assertEquals(ref[d], one[d], 1e-5, "text " + i + " dimension " + d);
            }
        }
    }
}
