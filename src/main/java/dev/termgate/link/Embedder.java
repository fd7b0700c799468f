package dev.termgate.link;

import java.util.List;

/** Turns texts into unit-length vectors; implementations are thread-safe. */
interface Embedder {
    /** Identifies the model, so cached vectors of another model are never reused. */
    String id();

    float[] embed(String text);

    List<float[]> embedAll(List<String> texts);

    /** The bundled in-process model (loaded on first use, shared by every linker). */
    static Embedder miniLm() {
        return MiniLmEmbedder.INSTANCE;
    }
}
