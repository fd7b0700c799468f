package dev.termgate.translate;

import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Semaphore;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * Builds the cards of the questions a batch will ask ahead of time, on one background thread, so that the
 * workers spend their time waiting on the model rather than on schema linking: while a worker waits for a
 * reply, the card of a question further down the list is built. At most {@code window} cards wait unclaimed,
 * which keeps memory flat for long question files. No card is built twice: a worker that reaches a question
 * the builder has not started builds it itself, and one whose card is under way waits for it.
 */
public final class CardPrefetch implements CardSource, AutoCloseable {

    /** One announced question's card: claimed by whoever builds it first (the builder or a worker), once. */
    private static final class Slot {
        final AtomicBoolean claimed = new AtomicBoolean();
        final CompletableFuture<Card> card = new CompletableFuture<>();
    }

    private final CardSource cards;
    private final Map<String, Slot> ready = new ConcurrentHashMap<>();
    private final Semaphore room;
    private final Thread builder;

    /**
     * @param questions the questions in the order they will be asked
     * @param window    how many built cards may wait unclaimed
     */
    public CardPrefetch(CardSource cards, List<String> questions, int window) {
        if (window < 1) throw new IllegalArgumentException("window must be at least 1");
        this.cards = cards;
        this.room = new Semaphore(window);
        List<String> order = List.copyOf(questions);
        order.forEach(q -> ready.putIfAbsent(q, new Slot()));
        this.builder = new Thread(() -> build(order), "termgate-card-prefetch");
        builder.setDaemon(true);
        builder.start();
    }

    private void build(List<String> order) {
        for (String q : order) {
            Slot slot = ready.get(q);
            if (slot == null || slot.claimed.get()) continue;
            try {
                room.acquire();
            } catch (InterruptedException e) {
                return;
            }
            // A worker that got there first builds the card itself; the room is free again.
            if (!slot.claimed.compareAndSet(false, true)) {
                room.release();
                continue;
            }
            fill(slot, q);
        }
    }

    private void fill(Slot slot, String question) {
        try {
            slot.card.complete(cards.card(question));
        } catch (RuntimeException e) {
            slot.card.completeExceptionally(e);
        }
    }

    @Override
    public Card card(String question) {
        Slot slot = ready.remove(question);
        if (slot == null) return cards.card(question);
        // Not started by the builder (it is behind): build it here; the builder skips it. Started or built: wait
        // for it, since building it twice would only take CPU from the other workers.
        if (slot.claimed.compareAndSet(false, true)) return cards.card(question);
        try {
            return slot.card.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return cards.card(question);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) throw r;
            throw new IllegalStateException(e.getCause());
        } finally {
            room.release();
        }
    }

    @Override
    public void close() {
        builder.interrupt();
    }
}
