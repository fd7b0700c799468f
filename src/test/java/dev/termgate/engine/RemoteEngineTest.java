package dev.termgate.engine;

import dev.termgate.cli.Main;
import dev.termgate.diag.Code;
import dev.termgate.parser.CypherParser;
import dev.termgate.query.Query;
import org.apache.tinkerpop.gremlin.server.GremlinServer;
import org.apache.tinkerpop.gremlin.server.Settings;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.ServerSocket;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The remote backend against a real Gremlin Server started in this JVM on 127.0.0.1 (gremlin-lang script
 * engine, GraphBinary): the same bytecode must give the same rows as the embedded engine on every demo gold
 * query, and a server that is down or goes away mid-run must give a clear service error.
 */
class RemoteEngineTest {
    private static GremlinServer server;
    private static int port;

    static GremlinServer start(TinkerGraph graph, int port) throws Exception {
        Settings settings = new Settings();
        settings.host = "127.0.0.1";
        settings.port = port;
        settings.scriptEngines = Map.of("gremlin-lang", new Settings.ScriptEngineSettings());
        GremlinServer s = new GremlinServer(settings);
        s.getServerGremlinExecutor().getGraphManager().putGraph("graph", graph);
        s.getServerGremlinExecutor().getGraphManager().putTraversalSource("g", graph.traversal());
        s.start().get();
        return s;
    }

    static int freePort() throws Exception {
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getByName("127.0.0.1"))) {
            return s.getLocalPort();
        }
    }

    @BeforeAll
    static void startServer() throws Exception {
        port = freePort();
        server = start(GraphFiles.demoGraph(DemoQueries.schema()), port);
    }

    @AfterAll
    static void stopServer() throws Exception {
        if (server != null) server.stop().get();
    }

    private static String url() {
        return "ws://127.0.0.1:" + port + "/gremlin";
    }

    @Test
    void remoteEqualsEmbeddedOnEveryDemoGoldQuery() {
        List<String> differences = new ArrayList<>();
        int pushed = 0;
        List<String> notPushedRemotely = new ArrayList<>();
        CypherParser parser = new CypherParser();
        try (Engine embedded = GraphFiles.demo(DemoQueries.schema()).engine();
             Engine remote = Engines.remote(url(), "g", Duration.ofSeconds(10))) {
            for (DemoQueries.Gold g : DemoQueries.gold()) {
                Query q = parser.parse(g.query()).tree();
                Request req = Request.of(q, g.query(), DemoQueries.schema(), Limits.defaults());
                long taken = ProjectionPushdown.TAKEN.get();
                Result a = embedded.run(req);
                long embeddedPushed = ProjectionPushdown.TAKEN.get() - taken;
                Result b = remote.run(req);
                // A pushed plan must also run pushed on the server (the bytecode is lambda-free and serializes),
                // not fall back to the client path.
                if (ProjectionPushdown.TAKEN.get() - taken != 2 * embeddedPushed) notPushedRemotely.add(g.id());
                pushed += (int) embeddedPushed;
                if (!a.columns().equals(b.columns()) || !RowBags.bag(a.rows()).equals(RowBags.bag(b.rows()))) differences.add(g.id());
            }
        }
        System.out.printf("remote == embedded on %d demo gold queries; %d ran their projection in the traversal%n",
                DemoQueries.gold().size(), pushed);
        assertEquals(List.of(), differences, "gold queries whose remote rows differ from the embedded rows");
        assertEquals(List.of(), notPushedRemotely, "gold queries pushed embedded but not remotely");
    }

    @Test
    void explainShowsTheTraversalSentToTheServer() {
        String text = "MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) WHERE c.name = 'Tessarine Lines' RETURN v.name";
        try (Engine remote = Engines.remote(url(), "g", Duration.ofSeconds(10))) {
            String plan = remote.explain(Request.of(new CypherParser().parse(text).tree(), text, DemoQueries.schema(),
                    Limits.defaults())).render();
            assertTrue(plan.contains("has('name', eq('Tessarine Lines'))"), plan);
            assertTrue(plan.contains("inE('OPERATED_BY')"), plan);
        }
    }

    @Test
    void serverDownIsAServiceFailure() throws Exception {
        int closed = freePort();
        EngineException e = assertThrows(EngineException.class,
                () -> Engines.remote("ws://127.0.0.1:" + closed + "/gremlin", "g", Duration.ofSeconds(2)));
        assertEquals(Code.REMOTE_UNAVAILABLE, e.code());
        assertTrue(e.isServiceFailure());

        StringWriter out = new StringWriter(), err = new StringWriter();
        int exit = Main.run(new String[] {"run", "--schema-free", "--remote", "ws://127.0.0.1:" + closed + "/gremlin",
                "MATCH (n) RETURN n"}, new PrintWriter(out, true), new PrintWriter(err, true));
        assertEquals(3, exit, err.toString());
        assertTrue(err.toString().contains("cannot reach the graph server"), err.toString());
        assertEquals("", out.toString(), "no rows are printed");
    }

    @Test
    void serverGoingAwayMidRunFailsWithoutPartialRows() throws Exception {
        int p = freePort();
        // Each MATCH after the first runs one traversal per incoming row: tens of thousands of round trips.
        TinkerGraph dense = LimitsTest.denseGraph(40);
        GremlinServer s = start(dense, p);
        String text = "MATCH (a) MATCH (a)-->(b) MATCH (b)-->(c) MATCH (c)-->(d) RETURN count(*)";
        try (Engine remote = Engines.remote("ws://127.0.0.1:" + p + "/gremlin", "g", Duration.ofSeconds(5))) {
            Thread stopper = new Thread(() -> {
                try {
                    Thread.sleep(1500);
                    s.stop().get();
                } catch (Exception ignored) {
                    // the assertion below decides
                }
            });
            stopper.start();
            EngineException e = assertThrows(EngineException.class, () -> remote.run(Request.of(
                    new CypherParser().parse(text).tree(), text, null, Limits.defaults().withTimeout(Duration.ofSeconds(40)))));
            assertEquals(Code.REMOTE_UNAVAILABLE, e.code(), e.getMessage());
            stopper.join();
        } finally {
            s.stop().get();
        }
    }
}
