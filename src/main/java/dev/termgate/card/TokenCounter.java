package dev.termgate.card;

import com.knuddels.jtokkit.Encodings;
import com.knuddels.jtokkit.api.Encoding;
import com.knuddels.jtokkit.api.EncodingRegistry;
import com.knuddels.jtokkit.api.EncodingType;

import java.util.EnumMap;
import java.util.Map;

/**
 * Counts tokens as a hosted model would. Each encoding is loaded on first use only and then shared: loading
 * o200k_base takes about half a second and 150 MB, which a command that never counts must not pay.
 */
public final class TokenCounter {

    private static final Map<TokenEncoding, TokenCounter> LOADED = new EnumMap<>(TokenEncoding.class);

    /** Lines remembered per encoding; beyond this many, lines are counted afresh (bounds memory, common practice). */
    static final int LINE_MEMO_LIMIT = 200_000;

    private final TokenEncoding encoding;
    private final Encoding tokenizer;
    private final Map<String, Integer> lineMemo = new java.util.concurrent.ConcurrentHashMap<>();

    private TokenCounter(TokenEncoding encoding, Encoding tokenizer) {
        this.encoding = encoding;
        this.tokenizer = tokenizer;
    }

    /** The counter for this encoding, loading its vocabulary the first time it is asked for. */
    public static TokenCounter of(TokenEncoding encoding) {
        synchronized (LOADED) {
            return LOADED.computeIfAbsent(encoding,
                    e -> new TokenCounter(e, Registry.LAZY.getEncoding(type(e))));
        }
    }

    /**
     * Starts loading the encoding on a background thread and returns at once, so that a command can read its
     * ontology meanwhile; {@link #of} then waits for that load instead of starting another.
     */
    public static void loadInBackground(TokenEncoding encoding) {
        Thread t = new Thread(() -> of(encoding), "termgate-tokenizer-" + encoding.id());
        t.setDaemon(true);
        t.start();
    }

    public TokenEncoding encoding() {
        return encoding;
    }

    /** Tokens of the text read as plain text (special-token markers in it are not treated as special). */
    public int count(String text) {
        return tokenizer.countTokensOrdinary(text);
    }

    /**
     * Tokens of one card line, remembered across cards: every question's card is assembled from the same lines
     * of one schema, so after the first few questions counting costs a lookup.
     */
    public int countLine(String line) {
        Integer known = lineMemo.get(line);
        if (known != null) return known;
        int n = count(line);
        if (lineMemo.size() < LINE_MEMO_LIMIT) lineMemo.put(line, n);
        return n;
    }

    private static EncodingType type(TokenEncoding e) {
        return switch (e) {
            case CL100K_BASE -> EncodingType.CL100K_BASE;
            case O200K_BASE -> EncodingType.O200K_BASE;
        };
    }

    /** Holder idiom: the registry itself is created only when the first count is asked for. */
    private static final class Registry {
        static final EncodingRegistry LAZY = Encodings.newLazyEncodingRegistry();
    }
}
