package dev.termgate.translate;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;

/**
 * Everything needed to reach a model, resolved from (in order) the command line, the environment and the
 * config file. The API key never comes from the command line (it would land in shell history and process
 * lists).
 *
 * <p>Config file: {@code $TERMGATE_CONFIG}, else {@code $XDG_CONFIG_HOME/termgate/config.properties}, else
 * {@code ~/.config/termgate/config.properties}. Keys: {@code model}, {@code base-url}, {@code api-key},
 * {@code timeout} (seconds), and per provider {@code openai.base-url}, {@code openai.api-key},
 * {@code ollama.base-url}. Environment: {@code TERMGATE_API_KEY}, then {@code OPENAI_API_KEY} for openai.
 *
 * @param apiKey      empty when none was found (fine for Ollama and for a server on this machine)
 * @param timeout     the wait for one reply before it counts as timed out (then retried)
 * @param maxRetries  retries of one request after a time-out, 429 or 5xx
 * @param inFlight    the most requests one client has out at a time (a batch's {@code --jobs}); 0 for no limit
 */
public record ModelSettings(ModelSpec spec, String baseUrl, Optional<Secret> apiKey, Duration timeout, int maxRetries,
                            int inFlight) {

    public static final String DEFAULT_OPENAI_URL = "https://api.openai.com/v1";
    public static final String DEFAULT_OLLAMA_URL = "http://localhost:11434";
    public static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(60);
    public static final int DEFAULT_RETRIES = 4;

    /**
     * @param modelOption   {@code --model}, or empty to use the config file's {@code model} (else offline)
     * @param baseUrlOption {@code --base-url}, or empty
     * @param timeoutOption {@code --model-timeout}, or empty
     * @throws IllegalArgumentException with a message fit for the user (bad model spec, unreadable config)
     */
    public static ModelSettings resolve(Optional<String> modelOption, Optional<String> baseUrlOption,
                                        Optional<Duration> timeoutOption, Map<String, String> env, Optional<Path> configFile) {
        Properties config = configFile.filter(Files::isRegularFile).map(ModelSettings::read).orElseGet(Properties::new);
        ModelSpec spec = ModelSpec.parse(modelOption.orElse(config.getProperty("model", "offline")));
        String p = spec.provider().word();
        String baseUrl = baseUrlOption.or(() -> prop(config, p + ".base-url")).or(() -> prop(config, "base-url"))
                .orElse(spec.provider() == ModelSpec.Provider.OLLAMA ? DEFAULT_OLLAMA_URL : DEFAULT_OPENAI_URL);
        Optional<String> key = Optional.ofNullable(env.get("TERMGATE_API_KEY")).filter(s -> !s.isBlank());
        if (key.isEmpty() && spec.provider() == ModelSpec.Provider.OPENAI) {
            key = Optional.ofNullable(env.get("OPENAI_API_KEY")).filter(s -> !s.isBlank());
        }
        if (key.isEmpty()) key = prop(config, p + ".api-key").or(() -> prop(config, "api-key"));
        Duration timeout = timeoutOption.or(() -> prop(config, "timeout").map(ModelSettings::seconds)).orElse(DEFAULT_TIMEOUT);
        return new ModelSettings(spec, stripSlash(baseUrl), key.map(String::strip).map(Secret::new), timeout, DEFAULT_RETRIES, 0);
    }

    /** Where the config file is looked for. */
    public static Path defaultConfigFile(Map<String, String> env) {
        String explicit = System.getProperty("termgate.config", env.get("TERMGATE_CONFIG"));
        if (explicit != null && !explicit.isBlank()) return Path.of(explicit);
        String xdg = env.get("XDG_CONFIG_HOME");
        Path base = xdg != null && !xdg.isBlank() ? Path.of(xdg) : Path.of(System.getProperty("user.home"), ".config");
        return base.resolve("termgate").resolve("config.properties");
    }

    /** Why these settings cannot reach the model, found before anything costly is loaded; empty when they can. */
    public Optional<String> problem() {
        if (spec.provider() == ModelSpec.Provider.OPENAI && apiKey.isEmpty() && !local()) {
            return Optional.of("the openai provider needs an API key for " + baseUrl
                    + ": set TERMGATE_API_KEY (or OPENAI_API_KEY) or api-key in the config file");
        }
        return Optional.empty();
    }

    /** True when the base URL points at this machine, where servers commonly need no key. */
    public boolean local() {
        try {
            String host = java.net.URI.create(baseUrl).getHost();
            return host != null && (host.equals("localhost") || host.equals("127.0.0.1") || host.equals("::1")
                    || host.equals("[::1]"));
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    public ModelSettings withSpec(ModelSpec other) {
        return new ModelSettings(other, baseUrl, apiKey, timeout, maxRetries, inFlight);
    }

    public ModelSettings withRetries(int retries) {
        return new ModelSettings(spec, baseUrl, apiKey, timeout, retries, inFlight);
    }

    /** These settings with at most {@code n} requests out at a time (0: no limit). */
    public ModelSettings withInFlight(int n) {
        if (n < 0) throw new IllegalArgumentException("in-flight limit must not be negative");
        return new ModelSettings(spec, baseUrl, apiKey, timeout, maxRetries, n);
    }

    private static Optional<String> prop(Properties p, String key) {
        return Optional.ofNullable(p.getProperty(key)).map(String::strip).filter(s -> !s.isEmpty());
    }

    private static Duration seconds(String s) {
        try {
            return Duration.ofMillis(Math.round(Double.parseDouble(s) * 1000));
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("config: timeout must be a number of seconds, got '" + s + "'");
        }
    }

    private static String stripSlash(String url) {
        return url.endsWith("/") ? url.substring(0, url.length() - 1) : url;
    }

    private static Properties read(Path file) {
        Properties p = new Properties();
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            p.load(r);
        } catch (IOException e) {
            throw new IllegalArgumentException("cannot read the config file " + file + ": " + e.getMessage());
        }
        return p;
    }
}
