package dev.termgate.engine;

import java.time.Duration;

/**
 * Bounds of one run. {@code maxRows} caps the rows returned (the result says when it was truncated);
 * {@code maxIntermediateRows} stops a run whose intermediate bindings grow past what fits in memory.
 */
public record Limits(Duration timeout, int maxRows, long maxIntermediateRows) {
    public static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(30);
    public static final int DEFAULT_MAX_ROWS = 1_000;
    /** common practice: a bound well below what a 4 GB heap holds as rows of a few values */
    public static final long DEFAULT_MAX_INTERMEDIATE = 5_000_000;

    public Limits {
        if (timeout.isNegative() || timeout.isZero()) throw new IllegalArgumentException("timeout must be positive");
        if (maxRows < 0) throw new IllegalArgumentException("maxRows must not be negative");
    }

    public static Limits defaults() {
        return new Limits(DEFAULT_TIMEOUT, DEFAULT_MAX_ROWS, DEFAULT_MAX_INTERMEDIATE);
    }

    /** No row cap (the TCK and evaluation compare whole results); still a time bound. */
    public static Limits unlimitedRows(Duration timeout) {
        return new Limits(timeout, Integer.MAX_VALUE, DEFAULT_MAX_INTERMEDIATE);
    }

    public Limits withTimeout(Duration t) {
        return new Limits(t, maxRows, maxIntermediateRows);
    }

    public Limits withMaxRows(int n) {
        return new Limits(timeout, n, maxIntermediateRows);
    }
}
