package dev.termgate.ontology;

import dev.termgate.schema.Names;

import java.nio.file.Path;
import java.util.Objects;
import java.util.Optional;

/**
 * How to load an ontology.
 *
 * @param naming   how IRIs become graph names
 * @param useCache whether to read and write the on-disk schema cache
 * @param cacheDir where the cache lives; empty means {@code $TERMGATE_CACHE}, else {@code ~/.cache/termgate}
 */
public record LoadOptions(Names.Style naming, boolean useCache, Optional<Path> cacheDir) {

    public LoadOptions {
        Objects.requireNonNull(naming);
        Objects.requireNonNull(cacheDir);
    }

    public static LoadOptions defaults() {
        return new LoadOptions(Names.Style.GRAPH, true, Optional.empty());
    }

    public LoadOptions withNaming(Names.Style style) {
        return new LoadOptions(style, useCache, cacheDir);
    }

    public LoadOptions withCache(boolean on) {
        return new LoadOptions(naming, on, cacheDir);
    }

    public LoadOptions withCacheDir(Path dir) {
        return new LoadOptions(naming, useCache, Optional.of(dir));
    }

    /** The cache directory these options resolve to. */
    public Path resolvedCacheDir() {
        if (cacheDir.isPresent()) return cacheDir.get();
        String env = System.getenv("TERMGATE_CACHE");
        if (env != null && !env.isBlank()) return Path.of(env);
        return Path.of(System.getProperty("user.home"), ".cache", "termgate");
    }
}
