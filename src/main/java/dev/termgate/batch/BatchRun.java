package dev.termgate.batch;

import com.google.gson.JsonObject;
import dev.termgate.translate.Answer;
import dev.termgate.translate.AnswerJson;
import dev.termgate.translate.Asker;
import dev.termgate.translate.Outcome;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.ServiceFailure;

import java.io.IOException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.ThreadFactory;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * Asks the unfinished questions of a batch on {@code workers} threads, runs the accepted queries and records each
 * result as soon as it is complete. A question whose model call keeps failing after the retries is left
 * unfinished (the next run asks it again); a refused key or an unknown model stops the whole run, since every
 * question would fail alike.
 * <p>
 * With a model, the caller gives more workers than the model may have requests out ({@code --jobs}, which the
 * model client enforces): while {@code jobs} workers wait for replies, the others check replies, run queries and
 * get the next questions' cards and prompts ready, so a freed request slot is taken at once by a request that is
 * ready. Checking a reply is then off the model's path: the model is kept as busy as {@code --jobs} allows.
 */
public final class BatchRun {

    /**
     * @param skipped     questions already in the output file
     * @param unfinished  questions left for a rerun because the model service failed for them
     * @param stoppedBy   the failure that stopped the run, when one did
     * @param lastFailure the last per-question service failure, to tell the user what went wrong
     */
    public record Summary(int asked, int valid, int invalid, int skipped, int unfinished, Duration elapsed,
                          Optional<ServiceFailure> stoppedBy, Optional<String> lastFailure) {}

    private final Asker asker;
    private final RunLimits limits;
    private final int workers;
    private final boolean withRows;

    /** @param workers questions handled at once (each: card, model, check, run, record) */
    public BatchRun(Asker asker, RunLimits limits, int workers, boolean withRows) {
        if (workers < 1) throw new IllegalArgumentException("workers must be at least 1");
        this.asker = asker;
        this.limits = limits;
        this.workers = workers;
        this.withRows = withRows;
    }

    /** The questions of {@code all} that the log has no result for. */
    public static List<BatchQuestion> todo(List<BatchQuestion> all, ResultLog log) {
        return all.stream().filter(q -> !log.finished(q.id())).toList();
    }

    public Summary run(List<BatchQuestion> all, ResultLog log, Progress progress) throws IOException, InterruptedException {
        List<BatchQuestion> todo = todo(all, log);
        int skipped = all.size() - todo.size();
        long t0 = System.nanoTime();
        AtomicInteger valid = new AtomicInteger();
        AtomicInteger invalid = new AtomicInteger();
        AtomicInteger unfinished = new AtomicInteger();
        AtomicReference<ServiceFailure> stop = new AtomicReference<>();
        AtomicReference<String> lastFailure = new AtomicReference<>();
        AtomicReference<IOException> writeError = new AtomicReference<>();
        ExecutorService pool = Executors.newFixedThreadPool(workers, daemon("termgate-batch"));
        boolean done = false;
        try {
            List<Future<?>> tasks = new ArrayList<>();
            for (BatchQuestion q : todo) {
                tasks.add(pool.submit(() -> {
                    if (stop.get() != null || writeError.get() != null) {
                        unfinished.incrementAndGet();
                        return null;
                    }
                    Outcome outcome;
                    try {
                        outcome = asker.loop().translate(q.question());
                    } catch (ServiceFailure f) {
                        unfinished.incrementAndGet();
                        progress.failedOne();
                        lastFailure.set(f.getMessage());
                        if (f.kind() == ServiceFailure.Kind.AUTHENTICATION || f.kind() == ServiceFailure.Kind.MODEL_NOT_FOUND) {
                            stop.compareAndSet(null, f);
                        }
                        return null;
                    }
                    try {
                        Answer a = asker.finish(outcome, limits);
                        log.append(record(q, a, withRows));
                        (a.outcome().valid() ? valid : invalid).incrementAndGet();
                        progress.finishedOne();
                    } catch (IOException e) {
                        unfinished.incrementAndGet();
                        writeError.compareAndSet(null, e);
                    }
                    return null;
                }));
            }
            awaitAll(tasks);
            done = true;
        } finally {
            if (done) {
                // Every task has returned and the workers are idle: they end on their own. Waiting for them to
                // end took 2.5-5 ms between the last answer and the exit (temporary traces, BatchThroughputBench).
                pool.shutdown();
            } else {
                pool.shutdownNow();
                pool.awaitTermination(5, TimeUnit.SECONDS);
            }
        }
        if (writeError.get() != null) throw writeError.get();
        return new Summary(valid.get() + invalid.get(), valid.get(), invalid.get(), skipped, unfinished.get(),
                Duration.ofNanos(System.nanoTime() - t0), Optional.ofNullable(stop.get()), Optional.ofNullable(lastFailure.get()));
    }

    private static void awaitAll(List<Future<?>> futures) throws InterruptedException {
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (java.util.concurrent.ExecutionException e) {
                throw new IllegalStateException("a batch worker failed", e.getCause());
            }
        }
    }

    private static ThreadFactory daemon(String name) {
        return r -> {
            Thread t = new Thread(r, name);
            t.setDaemon(true);
            return t;
        };
    }

    /** The JSON line of one question: its id and place first, then the answer's fields. */
    static JsonObject record(BatchQuestion q, Answer a, boolean withRows) {
        JsonObject j = new JsonObject();
        j.addProperty("id", q.id());
        j.addProperty("line", q.line());
        AnswerJson.of(a, withRows).entrySet().forEach(e -> j.add(e.getKey(), e.getValue()));
        return j;
    }
}
