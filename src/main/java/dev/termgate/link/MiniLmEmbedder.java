package dev.termgate.link;

import dev.langchain4j.data.embedding.Embedding;
import dev.langchain4j.data.segment.TextSegment;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtSession;
import dev.langchain4j.model.embedding.EmbeddingModel;
import dev.langchain4j.model.embedding.onnx.AbstractInProcessEmbeddingModel;
import dev.langchain4j.model.embedding.onnx.OnnxBertBiEncoder;
import dev.langchain4j.model.embedding.onnx.PoolingMode;
import dev.langchain4j.model.embedding.onnx.allminilml6v2q.AllMiniLmL6V2QuantizedEmbeddingModel;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Executor;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * all-MiniLM-L6-v2 (quantized) run in process by LangChain4j's ONNX runtime: no network, no GPU. The model
 * is loaded lazily on first use (about half a second) and shared, since loading it twice only costs memory.
 * <p>
 * The model file and tokenizer are the ones the LangChain4j artifact ships, but the ONNX session is our own:
 * by default the runtime gives each inference a pool of threads that spin between operators, which on a small
 * machine doubles the CPU of every question and takes a core from the batch workers and the engine. One
 * thread per inference, no spinning; {@link #embedAll} still runs inferences side by side on {@link #workers}.
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
                    m = new Quiet(workers());
                    model = m;
                }
            }
        }
        return m;
    }

    /**
     * Starts loading the model on a thread of its own, so that a later first embedding does not wait for it; a
     * failure is left for that first embedding to report.
     */
    void loadInBackground() {
        Thread t = new Thread(() -> {
            try {
                model();
            } catch (RuntimeException e) {
                // told by the first embedding, which tries again
            }
        }, "termgate-embed-load");
        t.setDaemon(true);
        t.start();
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

    /** The bundled model with a single-threaded, non-spinning session. */
    private static final class Quiet extends AbstractInProcessEmbeddingModel {
        private static final String MODEL = "all-minilm-l6-v2-q.onnx";
        private static final String TOKENIZER = "all-minilm-l6-v2-q-tokenizer.json";

        private final OnnxBertBiEncoder encoder;

        Quiet(Executor workers) {
            super(workers);
            ClassLoader loader = AllMiniLmL6V2QuantizedEmbeddingModel.class.getClassLoader();
            Optional<Path> cache = LinkOptions.defaultCacheDir();
            UnpackedModel.pointRuntimeAtUnpackedLibraries(loader, cache);
            OrtEnvironment env = OrtEnvironment.getEnvironment();
            try (OrtSession.SessionOptions options = new OrtSession.SessionOptions();
                 InputStream tokenizer = resource(TOKENIZER)) {
                options.setIntraOpNumThreads(1);
                options.setInterOpNumThreads(1);
                options.addConfigEntry("session.intra_op.allow_spinning", "0");
                options.addConfigEntry("session.inter_op.allow_spinning", "0");
                Optional<Path> unpacked = UnpackedModel.model(loader, MODEL, cache);
                OrtSession session;
                if (unpacked.isPresent()) {
                    session = env.createSession(unpacked.get().toString(), options);
                } else {
                    try (InputStream in = resource(MODEL)) {
                        session = env.createSession(in.readAllBytes(), options);
                    }
                }
                // Same pooling as the artifact's own model class (mean of the token vectors).
                encoder = new OnnxBertBiEncoder(env, session, tokenizer, PoolingMode.MEAN);
            } catch (OrtException e) {
                throw new IllegalStateException("the bundled embedding model cannot be loaded: " + e.getMessage(), e);
            } catch (IOException e) {
                throw new UncheckedIOException("the bundled embedding model cannot be read", e);
            }
        }

        private static InputStream resource(String name) {
            // The artifact's own model class finds its files next to it.
            InputStream in = AllMiniLmL6V2QuantizedEmbeddingModel.class.getClassLoader().getResourceAsStream(name);
            if (in == null) throw new IllegalStateException("the bundled embedding model is missing " + name);
            return in;
        }

        @Override
        protected OnnxBertBiEncoder model() {
            return encoder;
        }

        @Override
        protected Integer knownDimension() {
            return 384;
        }
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
