package dev.termgate.translate;

import dev.termgate.schema.GraphSchema;

/** Makes the translator that {@code --model} names. */
public final class Translators {

    private Translators() {}

    /** Lets the model clients' threads go, so that the process ends at once; call it just before exiting. */
    public static void releaseAtExit() {
        ModelHttpClient.stopSelectors();
    }

    /**
     * @throws IllegalArgumentException when the translator cannot be made as asked (missing key, offline
     *                                  interpreter not in this build); the message is for the user
     */
    public static Translator create(ModelSettings settings, Prompts prompts, int maxAttempts, GraphSchema schema) {
        if (settings.spec().offline()) {
            throw new IllegalArgumentException("the offline interpreter is not available in this build yet; "
                    + "choose a model with --model openai:MODEL or --model ollama:MODEL");
        }
        return ModelTranslator.create(settings, prompts, maxAttempts);
    }
}
