package dev.termgate.cli;

import dev.termgate.translate.ModelSettings;
import dev.termgate.translate.Prompts;
import dev.termgate.translate.TranslationLoop;
import picocli.CommandLine.Option;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.Optional;

/** Options that choose and reach the model; shared by ask, shell and batch. No option takes an API key. */
public final class ModelOptions {

    @Option(names = "--model", paramLabel = "PROVIDER:MODEL",
            description = "openai:MODEL (any OpenAI-compatible service), ollama:MODEL, or offline (default: the config file's model, else offline)")
    String model;

    @Option(names = "--base-url", paramLabel = "URL",
            description = "the provider's base URL, e.g. http://127.0.0.1:8080/v1 (default: the config file's, else the provider's usual one)")
    String baseUrl;

    @Option(names = "--model-timeout", paramLabel = "SECONDS",
            description = "wait for one reply before retrying (default: 60)")
    Double modelTimeout;

    @Option(names = "--attempts", paramLabel = "N", defaultValue = "" + TranslationLoop.DEFAULT_ATTEMPTS,
            description = "asks per question, re-asks with the diagnostics included (default: ${DEFAULT-VALUE})")
    int attempts;

    @Option(names = "--retries", paramLabel = "N", defaultValue = "" + ModelSettings.DEFAULT_RETRIES,
            description = "retries of one request after a time-out, 429 or 5xx, with exponential back-off (default: ${DEFAULT-VALUE})")
    int retries;

    @Option(names = "--prompts", paramLabel = "DIR", description = "a directory of prompt templates to use instead of the built-in ones")
    Path prompts;

    /** The environment; tests replace it. */
    Map<String, String> env = System.getenv();

    ModelSettings settings() {
        if (attempts < 1) throw new UserError(Exit.USAGE, "--attempts must be at least 1");
        if (retries < 0 || retries > 20) throw new UserError(Exit.USAGE, "--retries must be between 0 and 20");
        if (modelTimeout != null && !(modelTimeout > 0)) throw new UserError(Exit.USAGE, "--model-timeout must be positive");
        try {
            ModelSettings s = ModelSettings.resolve(Optional.ofNullable(model), Optional.ofNullable(baseUrl),
                    Optional.ofNullable(modelTimeout).map(t -> Duration.ofMillis(Math.round(t * 1000))),
                    env, Optional.of(ModelSettings.defaultConfigFile(env))).withRetries(retries);
            // Told now, before the ontology and the graph are loaded for nothing.
            s.problem().ifPresent(p -> { throw new UserError(Exit.USAGE, p); });
            return s;
        } catch (IllegalArgumentException e) {
            throw new UserError(Exit.USAGE, e.getMessage());
        }
    }

    /** Settings for another model spec typed in the shell; --base-url only carries over to the same provider. */
    ModelSettings settingsFor(String otherSpec) {
        try {
            var other = dev.termgate.translate.ModelSpec.parse(otherSpec);
            var first = settings();
            Optional<String> url = other.provider() == first.spec().provider() ? Optional.ofNullable(baseUrl) : Optional.empty();
            return ModelSettings.resolve(Optional.of(otherSpec), url,
                    Optional.ofNullable(modelTimeout).map(s -> Duration.ofMillis(Math.round(s * 1000))),
                    env, Optional.of(ModelSettings.defaultConfigFile(env))).withRetries(retries);
        } catch (UserError e) {
            throw new IllegalArgumentException(e.getMessage());
        }
    }

    Prompts prompts() {
        if (prompts != null && !java.nio.file.Files.isDirectory(prompts)) {
            throw new UserError(Exit.USAGE, "--prompts " + prompts + " is not a directory");
        }
        try {
            return Prompts.load(Optional.ofNullable(prompts));
        } catch (IllegalArgumentException e) {
            throw new UserError(Exit.USAGE, e.getMessage());
        }
    }
}
