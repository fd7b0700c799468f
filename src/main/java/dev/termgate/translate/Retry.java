package dev.termgate.translate;

import java.time.Duration;
import java.util.concurrent.ThreadLocalRandom;
import java.util.function.Supplier;

/**
 * Exponential back-off for calls to a model service: retries {@link ServiceFailure#retriable()} failures,
 * waiting 0.5 s, 1 s, 2 s, … (at most 30 s, with ±20% jitter so concurrent workers do not retry in step),
 * or exactly the server's {@code Retry-After} when it gives one (at most {@link #MAX_RETRY_AFTER}).
 * These numbers are common practice, not from a source.
 */
public final class Retry {

    static final Duration BASE = Duration.ofMillis(500);
    static final Duration CAP = Duration.ofSeconds(30);
    static final Duration MAX_RETRY_AFTER = Duration.ofMinutes(2);

    /** Sleeps; replaceable in tests. */
    public interface Sleeper {
        void sleep(Duration d) throws InterruptedException;
    }

    private final int maxRetries;
    private final Sleeper sleeper;

    public Retry(int maxRetries, Sleeper sleeper) {
        this.maxRetries = maxRetries;
        this.sleeper = sleeper;
    }

    public Retry(int maxRetries) {
        this(maxRetries, d -> Thread.sleep(d.toMillis()));
    }

    public <T> T call(Supplier<T> action) {
        for (int attempt = 0; ; attempt++) {
            try {
                return action.get();
            } catch (ServiceFailure f) {
                if (!f.retriable() || attempt >= maxRetries) {
                    if (!f.retriable() || maxRetries == 0) throw f;
                    throw new ServiceFailure(f.kind(), f.getMessage() + " (gave up after " + (attempt + 1) + " tries)",
                            f.retryAfter());
                }
                try {
                    sleeper.sleep(delay(attempt, f));
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    throw new ServiceFailure(ServiceFailure.Kind.FATAL, "cancelled", java.util.Optional.empty());
                }
            }
        }
    }

    static Duration delay(int attempt, ServiceFailure f) {
        if (f.retryAfter().isPresent()) {
            Duration d = f.retryAfter().get();
            return d.compareTo(MAX_RETRY_AFTER) > 0 ? MAX_RETRY_AFTER : d;
        }
        long base = BASE.toMillis() << Math.min(attempt, 16);
        long capped = Math.min(base, CAP.toMillis());
        double jitter = 0.8 + 0.4 * ThreadLocalRandom.current().nextDouble();
        return Duration.ofMillis(Math.round(capped * jitter));
    }
}
