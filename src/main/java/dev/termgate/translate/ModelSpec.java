package dev.termgate.translate;

import java.util.Locale;

/**
 * Which translator to use, as written after {@code --model}: {@code PROVIDER:MODEL} or {@code offline}.
 *
 * @param provider {@link Provider#OFFLINE} for the built-in interpreter
 * @param model    the provider's model name; empty for offline
 */
public record ModelSpec(Provider provider, String model) {

    public enum Provider {
        /** Any service speaking the OpenAI-compatible chat completions protocol. */
        OPENAI("openai"),
        /** A local or remote Ollama server. */
        OLLAMA("ollama"),
        /** termgate's own interpreter: no model, no network. */
        OFFLINE("offline");

        private final String word;

        Provider(String word) {
            this.word = word;
        }

        public String word() {
            return word;
        }
    }

    public static final ModelSpec OFFLINE = new ModelSpec(Provider.OFFLINE, "");

    /** @throws IllegalArgumentException with a message fit for the user */
    public static ModelSpec parse(String text) {
        String t = text == null ? "" : text.strip();
        if (t.isEmpty() || t.equalsIgnoreCase("offline")) return OFFLINE;
        int colon = t.indexOf(':');
        if (colon <= 0 || colon == t.length() - 1) {
            throw new IllegalArgumentException("--model takes PROVIDER:MODEL (providers: openai, ollama) or offline; got '" + t + "'");
        }
        String p = t.substring(0, colon).toLowerCase(Locale.ROOT);
        String m = t.substring(colon + 1).strip();
        for (Provider provider : Provider.values()) {
            if (provider != Provider.OFFLINE && provider.word.equals(p)) return new ModelSpec(provider, m);
        }
        throw new IllegalArgumentException("unknown model provider '" + p + "'; use openai:MODEL, ollama:MODEL or offline");
    }

    public boolean offline() {
        return provider == Provider.OFFLINE;
    }

    @Override
    public String toString() {
        return offline() ? "offline" : provider.word + ":" + model;
    }
}
