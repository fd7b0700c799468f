package dev.termgate.translate;

import java.time.Duration;

/** Limits on one run: wall time and rows. Defaults follow the engine's: 30 s, 1,000 rows. */
public record RunLimits(Duration timeout, int maxRows) {
    public static final RunLimits DEFAULT = new RunLimits(Duration.ofSeconds(30), 1_000);

    public RunLimits {
        if (timeout.isNegative() || timeout.isZero()) throw new IllegalArgumentException("timeout must be positive");
        if (maxRows < 1) throw new IllegalArgumentException("max rows must be at least 1");
    }
}
