package dev.termgate.translate;

import java.time.Duration;
import java.util.Optional;

/**
 * The model service failed. {@link Kind#RETRIABLE} failures (time-outs, 429, 5xx) are retried with back-off;
 * the others stop the command, because asking again cannot help (bad key, unknown model, bad request).
 */
public final class ServiceFailure extends RuntimeException {

    public enum Kind {
        /** Time-out, 429 or 5xx: worth asking again later. */
        RETRIABLE,
        /** The provider refused the credentials. */
        AUTHENTICATION,
        /** The provider does not know the model. */
        MODEL_NOT_FOUND,
        /** Anything else that asking again cannot fix. */
        FATAL
    }

    private final Kind kind;
    private final transient Optional<Duration> retryAfter;

    public ServiceFailure(Kind kind, String message, Optional<Duration> retryAfter) {
        super(message, null, false, false);
        this.kind = kind;
        this.retryAfter = retryAfter;
    }

    public Kind kind() {
        return kind;
    }

    /** The wait the server asked for (Retry-After), if it named one. */
    public Optional<Duration> retryAfter() {
        return retryAfter;
    }

    public boolean retriable() {
        return kind == Kind.RETRIABLE;
    }
}
