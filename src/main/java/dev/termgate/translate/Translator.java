package dev.termgate.translate;

/**
 * Turns a question and a schema card into a reply that should hold one openCypher read query. A model behind
 * LangChain4j is one implementation; the offline interpreter is another. Implementations must be safe to call
 * from several threads at once (the batch command asks concurrently).
 */
public interface Translator {

    /** How the result records name this translator, e.g. {@code openai:some-model} or {@code offline}. */
    String name();

    /**
     * @throws ServiceFailure when the service behind the translator failed (after its own retries)
     */
    Reply translate(TranslationRequest request);

    /**
     * Whether the request's schema card is read. The offline interpreter works on the whole schema and never
     * does, so no card is built for it (schema linking and token counting are the costly part of a question).
     */
    default boolean readsCard() {
        return true;
    }
}
