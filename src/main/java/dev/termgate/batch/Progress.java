package dev.termgate.batch;

import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Progress of a batch on standard error: on a terminal a bar redrawn in place (rate, ETA); otherwise a plain
 * line every {@link #PLAIN_EVERY} so that logs of unattended runs stay readable.
 */
public final class Progress implements AutoCloseable {

    static final Duration REDRAW = Duration.ofMillis(250);
    static final Duration PLAIN_EVERY = Duration.ofSeconds(10);
    private static final int BAR = 28;

    private final PrintWriter err;
    private final boolean terminal;
    private final int total;
    private final AtomicInteger done = new AtomicInteger();
    private final AtomicInteger failed = new AtomicInteger();
    private final long start = System.nanoTime();
    private final ScheduledExecutorService timer;

    /**
     * @param total    questions to do in this run (already finished ones are not counted)
     * @param terminal draw a bar in place; else print plain lines
     */
    public Progress(PrintWriter err, boolean terminal, int total, boolean enabled) {
        this.err = err;
        this.terminal = terminal;
        this.total = total;
        if (enabled && total > 0) {
            timer = Executors.newSingleThreadScheduledExecutor(r -> {
                Thread t = new Thread(r, "termgate-progress");
                t.setDaemon(true);
                return t;
            });
            long every = (terminal ? REDRAW : PLAIN_EVERY).toMillis();
            timer.scheduleAtFixedRate(this::draw, every, every, TimeUnit.MILLISECONDS);
        } else {
            timer = null;
        }
    }

    public void finishedOne() {
        done.incrementAndGet();
    }

    public void failedOne() {
        failed.incrementAndGet();
    }

    synchronized void draw() {
        String s = line();
        if (terminal) {
            err.print("\r" + s + "\u001b[K");
        } else {
            err.println(s);
        }
        err.flush();
    }

    /** {@code [#####-----] 120/200 60% 4.1 q/s ETA 0:19 (2 failed)} */
    String line() {
        int d = done.get();
        int f = failed.get();
        double secs = Math.max(1e-3, (System.nanoTime() - start) / 1e9);
        double rate = (d + f) / secs;
        int left = total - d - f;
        String eta = rate > 0 ? clock(Math.round(left / rate)) : "--:--";
        int filled = total == 0 ? BAR : (int) Math.round(BAR * (double) (d + f) / total);
        String bar = terminal ? "[" + "#".repeat(filled) + "-".repeat(BAR - filled) + "] " : "progress: ";
        return String.format(Locale.ROOT, "%s%d/%d %d%% %.1f q/s ETA %s%s", bar, d + f, total,
                total == 0 ? 100 : Math.round(100.0 * (d + f) / total), rate, eta, f > 0 ? " (" + f + " left for a rerun)" : "");
    }

    static String clock(long seconds) {
        return seconds >= 3600 ? String.format(Locale.ROOT, "%d:%02d:%02d", seconds / 3600, seconds / 60 % 60, seconds % 60)
                : String.format(Locale.ROOT, "%d:%02d", seconds / 60, seconds % 60);
    }

    @Override
    public void close() {
        if (timer != null) {
            timer.shutdownNow();
            draw();
            if (terminal) err.println();
        }
    }
}
