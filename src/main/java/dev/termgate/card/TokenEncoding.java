package dev.termgate.card;

import java.util.Arrays;
import java.util.Locale;
import java.util.Optional;

/** The tokenizers a card can be measured with: those of current hosted model families. */
public enum TokenEncoding {
    CL100K_BASE("cl100k_base"),
    O200K_BASE("o200k_base");

    /** The encoding used when none is asked for. */
    public static final TokenEncoding DEFAULT = CL100K_BASE;

    private final String id;

    TokenEncoding(String id) {
        this.id = id;
    }

    /** The tokenizer's own name, e.g. {@code cl100k_base}. */
    public String id() {
        return id;
    }

    public static Optional<TokenEncoding> fromId(String id) {
        String want = id.trim().toLowerCase(Locale.ROOT).replace('-', '_');
        return Arrays.stream(values()).filter(e -> e.id.equals(want)).findFirst();
    }

    @Override
    public String toString() {
        return id;
    }
}
