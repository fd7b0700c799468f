package dev.termgate.translate;

import java.time.Duration;
import java.util.Optional;

/**
 * A question's outcome and, when a valid query came out of it, that query's rows.
 *
 * @param run     empty when no query was valid (nothing is run then)
 * @param runTime time spent running
 */
public record Answer(Outcome outcome, Optional<RunResult> run, Duration runTime) {}
