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
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.ThreadFactory;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * Asks the unfinished questions of a batch, {@code jobs} of them at a time, runs the accepted queries and records
 * each result as soon as it is complete. A question whose model call keeps failing after the retries is left
 * unfinished (the next run asks it again); a refused key or an unknown model stops the whole run, since every
 * question would fail alike.
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
    private final int jobs;
    private final boolean withRows;

    public BatchRun(Asker asker, RunLimits limits, int jobs, boolean withRows) {
        if (jobs < 1) throw new IllegalArgumentException("jobs must be at least 1");
        this.asker = asker;
        this.limits = limits;
        this.jobs = jobs;
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
        // The model is the scarce resource: each of the `jobs` askers hands the run and the writing of its
        // answer to a finisher and asks the next question at once. When every finisher is busy and their
        // queue is full, the asker finishes the answer itself, so a slow graph slows the asking down instead
        // of piling up answers. The queue holds four answers per job: a process's first runs are slow (cold code),
        // and a queue of one per job could fill with them and leave the askers to run them.
        ExecutorService askers = Executors.newFixedThreadPool(jobs, daemon("termgate-batch"));
        ThreadPoolExecutor finishers = new ThreadPoolExecutor(jobs, jobs, 0, TimeUnit.MILLISECONDS,
                new ArrayBlockingQueue<>(4 * jobs), daemon("termgate-batch-run"), new ThreadPoolExecutor.CallerRunsPolicy());
        List<Future<?>> finishing = java.util.Collections.synchronizedList(new ArrayList<>());
        try {
            List<Future<?>> asking = new ArrayList<>();
            for (BatchQuestion q : todo) {
                asking.add(askers.submit(() -> {
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
                    finishing.add(finishers.submit(() -> {
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
                    return null;
                }));
            }
            awaitAll(asking);
            awaitAll(List.copyOf(finishing));
        } finally {
            askers.shutdownNow();
            finishers.shutdownNow();
            askers.awaitTermination(5, TimeUnit.SECONDS);
            finishers.awaitTermination(5, TimeUnit.SECONDS);
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
