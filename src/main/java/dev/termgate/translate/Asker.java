package dev.termgate.translate;

import java.time.Duration;
import java.util.Optional;

/** Translates a question and runs the query when (and only when) the gate accepted it. */
public final class Asker {

    private final TranslationLoop loop;
    private final QueryRunner runner;

    public Asker(TranslationLoop loop, QueryRunner runner) {
        this.loop = loop;
        this.runner = runner;
    }

    public TranslationLoop loop() {
        return loop;
    }

    /**
     * @throws ServiceFailure       when the model service failed
     * @throws InterruptedException when cancelled
     */
    public Answer ask(String question, RunLimits limits) throws InterruptedException {
        return finish(loop.translate(question), limits);
    }

    /**
     * The second half of {@link #ask}: runs the query of a translation the gate accepted (nothing otherwise), so
     * that a caller can run it on another thread while the model is asked the next question.
     *
     * @throws InterruptedException when cancelled
     */
    public Answer finish(Outcome outcome, RunLimits limits) throws InterruptedException {
        if (outcome.accepted().isEmpty()) return new Answer(outcome, Optional.empty(), Duration.ZERO);
        long t0 = System.nanoTime();
        RunResult rows = run(outcome.accepted().get(), limits);
        return new Answer(outcome, Optional.of(rows), Duration.ofNanos(System.nanoTime() - t0));
    }

    /** Runs a verdict of the gate; refuses anything the gate did not declare valid. */
    public RunResult run(Checked checked, RunLimits limits) throws InterruptedException {
        if (!checked.valid() || checked.tree().isEmpty() || !checked.errors().isEmpty()) {
            throw new IllegalStateException("only a query the gate accepted is run");
        }
        return runner.run(checked, limits);
    }
}
