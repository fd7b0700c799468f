package dev.termgate.translate;

import java.util.ArrayDeque;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.function.Function;

/**
 * At most {@code limit} requests out at a time (a batch's {@code --jobs}), the others queued in the order they
 * were ready. The thread that finishes reading a reply starts the next queued request (a sender signals it through
 * the {@code done} it is given, else the request's completion does): the model gets its next request without
 * waiting for a waiting thread to be woken and scheduled, which on a small, busy machine took milliseconds per
 * reply, and tens of them while a process's code was still cold (BatchThroughputBench).
 */
final class RequestRelay {

    /** A request waiting for a slot, and where its reply goes. */
    private static final class Waiting<T> {
        final Function<Runnable, CompletableFuture<T>> send;
        /** Whether the sent request's completion frees its slot, or only the signal (and a failure) does. */
        final boolean freedByCompletion;
        final CompletableFuture<T> reply = new CompletableFuture<>();

        Waiting(Function<Runnable, CompletableFuture<T>> send, boolean freedByCompletion) {
            this.send = send;
            this.freedByCompletion = freedByCompletion;
        }
    }

    private final int limit;
    private final ArrayDeque<Waiting<?>> queue = new ArrayDeque<>();
    private int out;

    RequestRelay(int limit) {
        if (limit < 1) throw new IllegalArgumentException("limit must be at least 1");
        this.limit = limit;
    }

    /**
     * Starts {@code send} now if a slot is free, else when one is; the result completes as the sent request's does.
     * {@code send} is given the signal that its reply is in (its slot may go on), to call as early as it can; the
     * request's completion gives it too. Cancelling the result before the request started withdraws it.
     */
    <T> CompletableFuture<T> submit(Function<Runnable, CompletableFuture<T>> send) {
        return enqueue(new Waiting<>(send, true));
    }

    /**
     * As {@link #submit}, for a sender whose result comes before its reply (a request written, its reply still
     * to be read): the slot is held until the sender calls the signal it was given, or its result fails.
     */
    <T> CompletableFuture<T> submitHolding(Function<Runnable, CompletableFuture<T>> send) {
        return enqueue(new Waiting<>(send, false));
    }

    private <T> CompletableFuture<T> enqueue(Waiting<T> w) {
        boolean now;
        synchronized (this) {
            now = out < limit;
            if (now) out++;
            else queue.add(w);
        }
        if (now) start(w);
        return w.reply;
    }

    /** Requests out now (tests). */
    synchronized int out() {
        return out;
    }

    private <T> void start(Waiting<T> w) {
        AtomicBoolean handedOn = new AtomicBoolean();
        Runnable done = () -> {
            if (handedOn.compareAndSet(false, true)) handOn();
        };
        CompletableFuture<T> sent;
        try {
            sent = w.send.apply(done);
        } catch (RuntimeException e) {
            done.run();
            w.reply.completeExceptionally(e);
            return;
        }
        sent.whenComplete((reply, failure) -> {
            if (w.freedByCompletion || failure != null) done.run();
            if (failure != null) w.reply.completeExceptionally(failure);
            else w.reply.complete(reply);
        });
    }

    /** A request is done: its slot goes to the first queued request that is still wanted. */
    private void handOn() {
        Waiting<?> next;
        synchronized (this) {
            do {
                next = queue.poll();
            } while (next != null && next.reply.isDone());
            if (next == null) out--;
        }
        if (next != null) start(next);
    }
}
