package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The request limit of a batch's model client: how many are out, in which order the others go, and failures. */
class RequestRelayTest {

    /** Requests that a test answers by hand, in the order they were sent. */
    private final List<CompletableFuture<String>> sent = new ArrayList<>();
    private final List<String> order = new ArrayList<>();
    /** Each sent request's signal that its reply is in. */
    private final List<Runnable> signals = new ArrayList<>();

    private CompletableFuture<String> send(RequestRelay relay, String name) {
        return relay.submit(done -> {
            signals.add(done);
            order.add(name);
            CompletableFuture<String> f = new CompletableFuture<>();
            sent.add(f);
            return f;
        });
    }

    @Test
    void atMostTheLimitIsOutAndTheOthersGoInTheOrderTheyCame() throws Exception {
        RequestRelay relay = new RequestRelay(2);
        List<CompletableFuture<String>> replies = new ArrayList<>();
        for (String n : List.of("a", "b", "c", "d", "e")) replies.add(send(relay, n));
        assertEquals(List.of("a", "b"), order);
        assertEquals(2, relay.out());
        // The thread that completes a reply sends the next request before the reply is handed on.
        sent.get(1).complete("B");
        assertEquals(List.of("a", "b", "c"), order);
        assertEquals("B", replies.get(1).get());
        sent.get(0).complete("A");
        sent.get(2).complete("C");
        assertEquals(List.of("a", "b", "c", "d", "e"), order);
        assertEquals(2, relay.out());
        sent.get(3).complete("D");
        sent.get(4).complete("E");
        assertEquals(0, relay.out());
        assertEquals(List.of("A", "B", "C", "D", "E"), replies.stream().map(CompletableFuture::join).toList());
    }

    @Test
    void aFailedRequestFreesItsSlotAndReportsItsFailure() {
        RequestRelay relay = new RequestRelay(1);
        CompletableFuture<String> first = send(relay, "a");
        CompletableFuture<String> second = send(relay, "b");
        sent.get(0).completeExceptionally(new java.io.IOException("connection reset"));
        ExecutionException e = assertThrows(ExecutionException.class, first::get);
        assertTrue(e.getCause() instanceof java.io.IOException);
        assertEquals(List.of("a", "b"), order);
        sent.get(1).complete("B");
        assertEquals("B", second.join());
        assertEquals(0, relay.out());
    }

    @Test
    void aRequestThatCannotBeSentFreesItsSlot() {
        RequestRelay relay = new RequestRelay(1);
        CompletableFuture<String> bad = relay.submit(done -> {
            throw new IllegalArgumentException("bad URI");
        });
        assertTrue(bad.isCompletedExceptionally());
        assertEquals(0, relay.out());
        send(relay, "a");
        assertEquals(List.of("a"), order);
    }

    @Test
    void aWithdrawnRequestIsNeverSent() {
        RequestRelay relay = new RequestRelay(1);
        send(relay, "a");
        CompletableFuture<String> withdrawn = send(relay, "b");
        CompletableFuture<String> kept = send(relay, "c");
        withdrawn.cancel(false);
        sent.get(0).complete("A");
        assertEquals(List.of("a", "c"), order);
        sent.get(1).complete("C");
        assertEquals("C", kept.join());
        assertEquals(0, relay.out());
    }

    @Test
    void aReplySignalledInHandsItsSlotOnOnceBeforeItCompletes() {
        RequestRelay relay = new RequestRelay(1);
        CompletableFuture<String> first = send(relay, "a");
        send(relay, "b");
        send(relay, "c");
        signals.get(0).run();
        assertEquals(List.of("a", "b"), order, "the slot went on when the reply was in");
        signals.get(0).run();
        sent.get(0).complete("A");
        assertEquals(List.of("a", "b"), order, "one reply hands its slot on once");
        assertEquals("A", first.join());
        assertEquals(1, relay.out());
    }

    @Test
    void aHeldSlotIsFreedByItsSignalOrAFailureNotByTheWrite() {
        RequestRelay relay = new RequestRelay(1);
        List<Runnable> held = new ArrayList<>();
        CompletableFuture<String> written = relay.submitHolding(done -> {
            held.add(done);
            return CompletableFuture.completedFuture("written");
        });
        assertEquals("written", written.join());
        send(relay, "next");
        assertEquals(List.of(), order, "written is not answered: the slot stays taken");
        held.get(0).run();
        assertEquals(List.of("next"), order);
        sent.get(0).complete("N");
        CompletableFuture<String> failed = relay.submitHolding(done -> CompletableFuture.failedFuture(new java.io.IOException("refused")));
        assertTrue(failed.isCompletedExceptionally());
        assertEquals(0, relay.out(), "a failed write gives its slot back");
    }
}
