package dev.termgate.link;

import dev.termgate.schema.GraphSchema;

/** Makes schema linkers. */
public final class Linkers {
    private Linkers() {}

    /**
     * The standard linker over one schema: lexical, semantic and value evidence (per {@code options}), then a
     * connected sub-schema. Thread-safe; the term embeddings are computed (or read from the cache) on the
     * first question or on {@link #warmUp}, so later questions are cheap.
     */
    public static SchemaLinker standard(GraphSchema schema, LinkOptions options) {
        return new StandardLinker(schema, options);
    }

    public static SchemaLinker standard(GraphSchema schema) {
        return standard(schema, LinkOptions.defaults());
    }

    /**
     * Starts loading the embedding model in the background (about half a second of a core), for a caller that
     * knows questions will need it while it has other loading to do.
     */
    public static void loadModelInBackground() {
        MiniLmEmbedder.INSTANCE.loadInBackground();
    }

    /** Builds the linker's indexes and embeddings now instead of on the first question. */
    public static SchemaLinker warmUp(SchemaLinker linker) {
        if (linker instanceof StandardLinker s) s.warmUp();
        return linker;
    }
}
