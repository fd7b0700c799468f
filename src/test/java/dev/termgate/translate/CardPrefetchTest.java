package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Cards built ahead: each question gets its own card whoever builds it, and the window bounds what waits. */
class CardPrefetchTest {

    private static CardSource.Card cardOf(String q) {
        return new CardSource.Card("card for " + q, q.length(), List.of(q));
    }

    /** Eight workers ask every question once each, concurrently; each must get its own question's card. */
    private static void askedByEightWorkers(CardPrefetch prefetch, List<String> questions) throws Exception {
        ExecutorService pool = Executors.newFixedThreadPool(8);
        try (CardPrefetch cards = prefetch) {
            List<Future<Boolean>> checks = new ArrayList<>();
            for (String q : questions) checks.add(pool.submit(() -> cards.card(q).equals(cardOf(q))));
            for (Future<Boolean> f : checks) assertTrue(f.get());
        } finally {
            pool.shutdownNow();
        }
    }

    @Test
    void everyQuestionGetsItsOwnCardUnderConcurrency() throws Exception {
        List<String> questions = new ArrayList<>();
        for (int i = 0; i < 500; i++) questions.add("question " + (i % 450)); // some asked twice
        AtomicInteger built = new AtomicInteger();
        CardSource source = q -> {
            built.incrementAndGet();
            return cardOf(q);
        };
        askedByEightWorkers(new CardPrefetch(source, questions, 5), questions);
        // Each asking builds at most once: 450 first askings plus 50 repeats, whose card was already taken.
        assertEquals(500, built.get(), "no card was built twice");
    }

    @Test
    void aCardUnderWayIsWaitedForNotBuiltAgain() throws Exception {
        List<String> questions = new ArrayList<>();
        for (int i = 0; i < 100; i++) questions.add("question " + i);
        AtomicInteger built = new AtomicInteger();
        // Slow enough that the builder and the workers meet on the same questions.
        CardSource slow = q -> {
            built.incrementAndGet();
            try {
                Thread.sleep(5);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return cardOf(q);
        };
        askedByEightWorkers(new CardPrefetch(slow, questions, 32), questions);
        assertEquals(100, built.get());
    }

    @Test
    void atMostTheWindowWaitsUnclaimed() throws Exception {
        AtomicInteger built = new AtomicInteger();
        List<String> questions = List.of("a", "b", "c", "d", "e", "f", "g", "h");
        try (CardPrefetch cards = new CardPrefetch(q -> {
            built.incrementAndGet();
            return cardOf(q);
        }, questions, 3)) {
            long until = System.nanoTime() + 10_000_000_000L;
            while (built.get() < 3 && System.nanoTime() < until) Thread.sleep(1);
            Thread.sleep(200);
            assertEquals(3, built.get(), "the builder stops when three cards wait");
            assertEquals(cardOf("a"), cards.card("a"));
            until = System.nanoTime() + 10_000_000_000L;
            while (built.get() < 4 && System.nanoTime() < until) Thread.sleep(1);
            Thread.sleep(200);
            assertEquals(4, built.get(), "claiming one makes room for one more");
            for (String q : questions.subList(1, questions.size())) assertEquals(cardOf(q), cards.card(q));
        }
    }

    @Test
    void aFailureReachesTheWorkerThatNeedsTheCard() {
        try (CardPrefetch cards = new CardPrefetch(q -> {
            if (q.equals("bad")) throw new IllegalStateException("linking failed");
            return cardOf(q);
        }, List.of("ok", "bad"), 2)) {
            assertEquals(cardOf("ok"), cards.card("ok"));
            assertThrows(IllegalStateException.class, () -> cards.card("bad"));
            assertEquals(cardOf("later"), cards.card("later"), "a question not announced is built on demand");
        }
    }
}
