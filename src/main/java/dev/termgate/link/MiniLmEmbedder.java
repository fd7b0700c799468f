package dev.termgate.link;

import dev.langchain4j.data.embedding.Embedding;
import dev.langchain4j.data.segment.TextSegment;
import dev.langchain4j.model.embedding.EmbeddingModel;
import dev.langchain4j.model.embedding.onnx.allminilml6v2q.AllMiniLmL6V2QuantizedEmbeddingModel;

import java.util.ArrayList;
import java.util.List;

/**
 * all-MiniLM-L6-v2 (quantized) run in process by LangChain4j's ONNX runtime: no network, no GPU. The model
 * is loaded lazily on first use (about half a second) and shared, since loading it twice only costs memory.
 */
final class MiniLmEmbedder implements Embedder {

    static final MiniLmEmbedder INSTANCE = new MiniLmEmbedder();

    private volatile EmbeddingModel model;

    private MiniLmEmbedder() {}

    private EmbeddingModel model() {
        EmbeddingModel m = model;
        if (m == null) {
            synchronized (this) {
                m = model;
                if (m == null) {
                    m = new AllMiniLmL6V2QuantizedEmbeddingModel();
                    model = m;
                }
            }
        }
        return m;
    }

    @Override
    public String id() {
        return "all-minilm-l6-v2-q";
    }

    @Override
    public float[] embed(String text) {
        return unit(model().embed(text).content());
    }

    @Override
    public List<float[]> embedAll(List<String> texts) {
        List<TextSegment> segments = texts.stream().map(TextSegment::from).toList();
        List<Embedding> es = model().embedAll(segments).content();
        List<float[]> out = new ArrayList<>(es.size());
        for (Embedding e : es) out.add(unit(e));
        return out;
    }

    private static float[] unit(Embedding e) {
        float[] v = e.vector().clone();
        Vectors.normalize(v);
        return v;
    }
}
