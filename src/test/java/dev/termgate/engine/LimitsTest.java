package dev.termgate.engine;

import dev.termgate.diag.Code;
import dev.termgate.graph.GraphBuilder;
import dev.termgate.parser.CypherParser;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Time limit, row cap and cancellation: a run never hangs and never passes a partial result off as complete. */
class LimitsTest {

    /** A complete directed graph on n nodes: unbounded paths explode combinatorially. */
    static TinkerGraph denseGraph(int n) {
        GraphBuilder b = new GraphBuilder();
        List<Object> ids = new ArrayList<>();
        for (int i = 0; i < n; i++) ids.add(b.addNode(List.of("N"), Map.of("num", (long) i)));
        for (Object x : ids) for (Object y : ids) if (!x.equals(y)) b.addRelationship(x, y, "R", Map.of());
        return b.graph();
    }

    private static Request request(String text, Limits limits) {
        return Request.of(new CypherParser().parse(text).tree(), text, null, limits);
    }

    @Test
    void unboundedVariableLengthOnADenseGraphIsStoppedByTheTimeLimit() {
        try (Engine e = Engines.embedded(denseGraph(30), "dense")) {
            long t0 = System.nanoTime();
            EngineException ex = assertThrows(EngineException.class,
                    () -> e.run(request("MATCH p = (a)-[*]->(b) RETURN count(p)", Limits.defaults().withTimeout(Duration.ofMillis(800)))));
            long ms = (System.nanoTime() - t0) / 1_000_000;
            assertTrue(ex.code() == Code.TIMEOUT || ex.code() == Code.RUNTIME_ERROR, ex.getMessage());
            // common practice: stopping promptly means within a few seconds of the limit on a loaded machine
            assertTrue(ms < 15_000, "stopped after " + ms + " ms");
        }
    }

    @Test
    void aCartesianProductInsideOneTraversalIsInterruptedAtTheDeadline() {
        try (Engine e = Engines.embedded(denseGraph(60), "dense")) {
            EngineException ex = assertThrows(EngineException.class, () -> e.run(request(
                    "MATCH (a)-->(b)-->(c)-->(d) RETURN count(*)", Limits.defaults().withTimeout(Duration.ofMillis(500)))));
            assertTrue(ex.code() == Code.TIMEOUT || ex.code() == Code.RUNTIME_ERROR, ex.getMessage());
        }
    }

    @Test
    void rowCapTruncatesAndSaysSo() {
        try (Engine e = Engines.embedded(denseGraph(10), "dense")) {
            Result r = e.run(request("MATCH (a)-->(b) RETURN a.num, b.num", Limits.defaults().withMaxRows(7)));
            assertEquals(7, r.rows().size());
            assertTrue(r.truncated());
            assertTrue(ResultFormat.table(r).contains("TRUNCATED"));
            assertTrue(ResultFormat.jsonText(r).contains("\"truncated\":true"));
            Result all = e.run(request("MATCH (a)-->(b) RETURN a.num, b.num", Limits.defaults()));
            assertEquals(90, all.rows().size());
            assertFalse(all.truncated());
        }
    }

    @Test
    void cancelFromAnotherThreadStopsTheRun() throws Exception {
        try (Engine e = Engines.embedded(denseGraph(30), "dense")) {
            Limits limits = Limits.defaults().withTimeout(Duration.ofSeconds(60));
            RunControl control = RunControl.of(limits);
            Thread canceller = new Thread(() -> {
                try {
                    Thread.sleep(300);
                } catch (InterruptedException ignored) {
                    return;
                }
                control.cancel();
            });
            canceller.start();
            EngineException ex = assertThrows(EngineException.class,
                    () -> e.run(request("MATCH p = (a)-[*]->(b) RETURN count(p)", limits), control));
            assertEquals(Code.CANCELLED, ex.code());
            canceller.join();
            assertFalse(Thread.currentThread().isInterrupted(), "the caller's thread is left clean");
        }
    }

    @Test
    void queryOnAnEmptyGraphGivesNoRowsOrOneAggregateRow() {
        try (Engine e = Engines.embedded(new GraphBuilder().graph(), "empty")) {
            Result none = e.run(request("MATCH (v:Vessel) RETURN v.name", Limits.defaults()));
            assertEquals(List.of("v.name"), none.columns());
            assertEquals(0, none.rows().size());
            // openCypher: aggregation without grouping keys over no rows gives one row
            Result count = e.run(request("MATCH (v:Vessel) RETURN count(v) AS n", Limits.defaults()));
            assertEquals(List.of(List.of(0L)), count.rows());
        }
    }

    @Test
    void writeClausesAreNeverRunByTheQueryEngine() {
        try (Engine e = Engines.embedded(new GraphBuilder().graph(), "empty")) {
            EngineException ex = assertThrows(EngineException.class,
                    () -> e.run(request("CREATE (n:X) RETURN n", Limits.defaults())));
            assertEquals(Code.RUNTIME_ERROR, ex.code());
            assertEquals(0, e.run(request("MATCH (n) RETURN n", Limits.defaults())).rows().size());
        }
    }
}
