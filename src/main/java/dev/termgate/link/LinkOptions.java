package dev.termgate.link;

import java.nio.file.Path;
import java.util.Objects;
import java.util.Optional;

/**
 * How a linker weighs its evidence.
 *
 * @param lexical   match words of the question against names and labels
 * @param semantic  compare sentence embeddings of the question and of each term
 * @param language  a language tag whose labels are preferred, or {@code "auto"} to guess it from the question
 *                  (English when unsure)
 * @param values    instance values the question may mention (empty when no graph is loaded)
 * @param cacheDir  where term embeddings are cached; empty disables the cache
 * @param maxTerms  at most this many terms in a ranking
 */
public record LinkOptions(boolean lexical, boolean semantic, String language, ValueIndex values,
                          Optional<Path> cacheDir, int maxTerms) {

    public static final String AUTO = "auto";

    public LinkOptions {
        Objects.requireNonNull(language);
        Objects.requireNonNull(values);
        Objects.requireNonNull(cacheDir);
        if (!lexical && !semantic) throw new IllegalArgumentException("at least one of lexical and semantic evidence is needed");
        if (maxTerms < 1) throw new IllegalArgumentException("maxTerms must be positive");
    }

    /** Lexical and semantic evidence, language guessed, no values, the default cache directory. */
    public static LinkOptions defaults() {
        return new LinkOptions(true, true, AUTO, ValueIndex.empty(), defaultCacheDir(), 120);
    }

    /**
     * {@code $TERMGATE_CACHE/embeddings}, else {@code ~/.cache/termgate/embeddings}; empty when neither can be
     * determined.
     */
    public static Optional<Path> defaultCacheDir() {
        String env = System.getenv("TERMGATE_CACHE");
        if (env != null && !env.isBlank()) return Optional.of(Path.of(env, "embeddings"));
        String home = System.getProperty("user.home");
        if (home == null || home.isBlank()) return Optional.empty();
        return Optional.of(Path.of(home, ".cache", "termgate", "embeddings"));
    }

    /** Ablation: names and labels only (no model is loaded). */
    public LinkOptions lexicalOnly() {
        return new LinkOptions(true, false, language, values, cacheDir, maxTerms);
    }

    /** Ablation: embeddings only. */
    public LinkOptions semanticOnly() {
        return new LinkOptions(false, true, language, values, cacheDir, maxTerms);
    }

    public LinkOptions withLanguage(String tag) {
        return new LinkOptions(lexical, semantic, tag, values, cacheDir, maxTerms);
    }

    public LinkOptions withValues(ValueIndex index) {
        return new LinkOptions(lexical, semantic, language, index, cacheDir, maxTerms);
    }

    public LinkOptions withCacheDir(Path dir) {
        return new LinkOptions(lexical, semantic, language, values, Optional.ofNullable(dir), maxTerms);
    }

    public LinkOptions withoutCache() {
        return new LinkOptions(lexical, semantic, language, values, Optional.empty(), maxTerms);
    }

    public LinkOptions withMaxTerms(int n) {
        return new LinkOptions(lexical, semantic, language, values, cacheDir, n);
    }
}
