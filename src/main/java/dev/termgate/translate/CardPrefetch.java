package dev.termgate.translate;

import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Semaphore;

/**
 * Builds the cards of the questions a batch will ask ahead of time, on one background thread, so that the
 * workers spend their time waiting on the model rather than on schema linking: while a worker waits for a
 * reply, the card of a question further down the list is built. At most {@code window} cards wait unclaimed,
 * which keeps memory flat for long question files.
 */
public final class CardPrefetch implements CardSource, AutoCloseable {

    private final CardSource cards;
    private final Map<String, CompletableFuture<Card>> ready = new ConcurrentHashMap<>();
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
        order.forEach(q -> ready.putIfAbsent(q, new CompletableFuture<>()));
        this.builder = new Thread(() -> build(order), "termgate-card-prefetch");
        builder.setDaemon(true);
        builder.start();
    }

    private void build(List<String> order) {
        for (String q : order) {
            CompletableFuture<Card> slot = ready.get(q);
            if (slot == null || slot.isDone()) continue;
            try {
                room.acquire();
            } catch (InterruptedException e) {
                return;
            }
            boolean kept;
            try {
                kept = !slot.isDone() && slot.complete(cards.card(q));
            } catch (RuntimeException e) {
                kept = slot.completeExceptionally(e);
            }
            // A worker that got there first built the card itself; the room is free again.
            if (!kept) room.release();
        }
    }

    @Override
    public Card card(String question) {
        CompletableFuture<Card> slot = ready.remove(question);
        if (slot == null) return cards.card(question);
        // Built already: claim it. Not yet (the builder is behind or the window is full): build it here rather
        // than wait, and leave the builder's copy, if it is under way, to be thrown away.
        if (slot.isDone() || !slot.complete(cards.card(question))) room.release();
        try {
            return slot.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return cards.card(question);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) throw r;
            throw new IllegalStateException(e.getCause());
        }
    }

    @Override
    public void close() {
        builder.interrupt();
    }
}
