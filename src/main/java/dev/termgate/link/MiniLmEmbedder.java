package dev.termgate.link;

import dev.langchain4j.data.embedding.Embedding;
import dev.langchain4j.data.segment.TextSegment;
import dev.langchain4j.model.embedding.EmbeddingModel;
import dev.langchain4j.model.embedding.onnx.allminilml6v2q.AllMiniLmL6V2QuantizedEmbeddingModel;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Executor;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;

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
                    m = new AllMiniLmL6V2QuantizedEmbeddingModel(workers());
                    model = m;
                }
            }
        }
        return m;
    }

    /**
     * The model's batch worker pool. Daemon threads: the library's default pool keeps a JVM alive for a minute
     * after the last embedding, which a command (or a test runner) must not wait for.
     */
    private static Executor workers() {
        int n = Math.max(1, Runtime.getRuntime().availableProcessors());
        AtomicInteger count = new AtomicInteger();
        return Executors.newFixedThreadPool(n, r -> {
            Thread t = new Thread(r, "termgate-embed-" + count.incrementAndGet());
            t.setDaemon(true);
            return t;
        });
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
