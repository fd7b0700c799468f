package dev.termgate.engine;

import dev.termgate.diag.Code;

import java.time.Duration;

/**
 * The deadline and the cancel flag of one run, polled by every loop of the client-side evaluator; the
 * traversal thread is also interrupted on cancel so that TinkerGraph stops inside a step.
 */
public final class RunControl {
    private final long deadlineNanos;
    private final Duration timeout;
    private final long maxIntermediate;
    private volatile boolean cancelled;
    private volatile boolean timedOut;
    private volatile Thread worker;
    private int tick;

    /** A control for one run; the clock starts now. */
    public static RunControl of(Limits limits) {
        return new RunControl(limits);
    }

    RunControl(Limits limits) {
        this.timeout = limits.timeout();
        this.deadlineNanos = System.nanoTime() + limits.timeout().toNanos();
        this.maxIntermediate = limits.maxIntermediateRows();
    }

    /** Asks the run to stop; safe from any thread (the shell's Ctrl-C handler). */
    public void cancel() {
        cancelled = true;
        Thread t = worker;
        if (t != null) t.interrupt();
    }

    public boolean isCancelled() {
        return cancelled;
    }

    void attach(Thread t) {
        worker = t;
    }

    /** Cheap enough for inner loops: the clock is read every 256 calls. */
    void check() {
        if ((++tick & 0xff) != 0) return;
        checkNow();
    }

    /** Called by the watchdog at the deadline. */
    void expire() {
        timedOut = true;
        Thread t = worker;
        if (t != null) t.interrupt();
    }

    long remainingMillis() {
        return Math.max(1, (deadlineNanos - System.nanoTime()) / 1_000_000);
    }

    /** The error for an interrupted traversal: the deadline or the user. */
    EngineException stopError() {
        return timedOut || expired() ? timeoutError() : new EngineException(Code.CANCELLED);
    }

    void checkNow() {
        if (timedOut) throw timeoutError();
        if (cancelled) throw new EngineException(Code.CANCELLED);
        if (System.nanoTime() > deadlineNanos) throw timeoutError();
        if (Thread.currentThread().isInterrupted() && worker == Thread.currentThread()) {
            throw new EngineException(Code.CANCELLED);
        }
    }

    EngineException timeoutError() {
        return new EngineException(Code.TIMEOUT, describe(timeout));
    }

    boolean expired() {
        return System.nanoTime() > deadlineNanos;
    }

    void checkSize(long rows) {
        if (rows > maxIntermediate) {
            throw EngineException.runtime("intermediate result exceeds " + maxIntermediate
                    + " rows; add a filter or a LIMIT");
        }
    }

    static String describe(Duration d) {
        long ms = d.toMillis();
        return ms % 1000 == 0 ? (ms / 1000) + " s" : ms + " ms";
    }
}
