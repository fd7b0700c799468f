package dev.termgate.bench;

import dev.termgate.engine.Engine;
import dev.termgate.engine.Engines;
import dev.termgate.engine.GraphFiles;
import dev.termgate.engine.InProcessServer;
import dev.termgate.engine.Limits;
import dev.termgate.engine.EngineSwitches;
import dev.termgate.engine.Request;
import dev.termgate.engine.ScaleGraph;
import dev.termgate.graph.GraphIo;
import dev.termgate.parser.CypherParser;
import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;

/**
 * Engine speed and memory (run with {@code mvn -B -Pbench verify -Dtest=EngineBench}); figures are printed and
 * copied into the README, never asserted.
 */
@Tag("bench")
class EngineBench {
    /** A typical two-hop question with a property filter. */
    static final String TWO_HOP = "MATCH (c:Carrier)<-[:OPERATED_BY]-(v:Vessel)<-[:PERFORMED_BY]-(voy:Voyage) "
            + "WHERE c.name = 'Carrier 7' RETURN v.name, count(voy) AS voyages ORDER BY voyages DESC";

    @Test
    void twoHopQueryOn100kNodes() {
        TinkerGraph g = ScaleGraph.generate(100_000, 42);
        Query q = new CypherParser().parse(TWO_HOP).tree();
        // The demo ontology's schema: :Vessel matches its subclasses (ContainerShip, Tanker, BulkCarrier).
        GraphSchema schema = dev.termgate.ontology.OntologyLoader.load(List.of(dev.termgate.ontology.OntologyLoader.DEMO)).schema();
        Request req = Request.of(q, TWO_HOP, schema, Limits.defaults());
        try (Engine e = Engines.embedded(g, "bench")) {
            // The first run also builds the index of the key the query looks its start node up by.
            long first = System.nanoTime();
            e.run(req);
            first = System.nanoTime() - first;
            for (int i = 0; i < 30; i++) e.run(req);
            long[] run = new long[50], plan = new long[50];
            int rows = 0;
            for (int i = 0; i < run.length; i++) {
                long t0 = System.nanoTime();
                rows = e.run(req).rows().size();
                run[i] = System.nanoTime() - t0;
                t0 = System.nanoTime();
                e.explain(req);
                plan[i] = System.nanoTime() - t0;
            }
            System.out.printf("100k nodes: two-hop query median %.2f ms (%d rows; first run with index build %.1f ms); "
                    + "plan compilation median %.3f ms; load average %.2f%n",
                    median(run) / 1e6, rows, first / 1e6, median(plan) / 1e6, loadAverage());
        }
    }

    /** Calls per port: an aggregate over every port call, the case ProjectionPushdown is for. */
    static final String CALLS_BY_PORT = "MATCH (pc:PortCall)-[:AT_PORT]->(p:Port) "
            + "RETURN p.name, count(pc) AS calls ORDER BY calls DESC LIMIT 3";

    @Test
    void pushedAggregatesOn100kNodes() {
        TinkerGraph g = ScaleGraph.generate(100_000, 42);
        GraphSchema schema = dev.termgate.ontology.OntologyLoader.load(List.of(dev.termgate.ontology.OntologyLoader.DEMO)).schema();
        try (Engine e = Engines.embedded(g, "bench")) {
            for (String text : List.of(TWO_HOP, CALLS_BY_PORT)) {
                Request req = Request.of(new CypherParser().parse(text).tree(), text, schema, Limits.defaults());
                double[] medians = pushedAndClientOnly(e, req, 10, 30);
                System.out.printf("100k nodes: %s%n  projection pushed %.2f ms median, client-only %.2f ms median; "
                        + "load average %.2f%n", text, medians[0], medians[1], loadAverage());
            }
        }
    }

    /** Median milliseconds of {@code runs} runs after {@code warm} warm-up runs: [0] pushed down, [1] client-only. */
    private static double[] pushedAndClientOnly(Engine e, Request req, int warm, int runs) {
        return onAndOff(EngineSwitches::pushdown, e, req, warm, runs);
    }

    /** Median milliseconds of {@code runs} runs after {@code warm} warm-up runs: [0] with a switch on, [1] off. */
    private static double[] onAndOff(java.util.function.Consumer<Boolean> toggle, Engine e, Request req, int warm, int runs) {
        double[] medians = new double[2];
        for (int mode = 0; mode < 2; mode++) {
            toggle.accept(mode == 0);
            try {
                for (int i = 0; i < warm; i++) e.run(req);
                long[] run = new long[runs];
                for (int i = 0; i < run.length; i++) {
                    long t0 = System.nanoTime();
                    e.run(req);
                    run[i] = System.nanoTime() - t0;
                }
                medians[mode] = median(run) / 1e6;
            } finally {
                toggle.accept(true);
            }
        }
        return medians;
    }

    /**
     * Matches that start from a label alone: TinkerGraph tests every vertex's label, the engine's label index looks
     * the label's vertices up by id (Ports are 1% of the scale graph, Vessels with their subclasses 10%, Voyages
     * 29%, PortCalls 59%, past the index's threshold); with the index the planner also starts the calls by port
     * from the ports, the rarer label, where it took the first node before.
     */
    @Test
    void labelStartsOn1MNodes() {
        TinkerGraph g = ScaleGraph.generate(1_000_000, 42);
        GraphSchema schema = dev.termgate.ontology.OntologyLoader.load(List.of(dev.termgate.ontology.OntologyLoader.DEMO)).schema();
        // What the first labelled query paid before the index: the pass that lists the stored labels.
        long l0 = System.nanoTime();
        g.traversal().V().label().dedup().toList();
        System.out.printf("1M nodes: listing the stored labels alone %.0f ms%n", (System.nanoTime() - l0) / 1e6);
        countByIdAndByScan(g);
        try (Engine e = Engines.embedded(g, "bench")) {
            String first = "MATCH (p:Port) RETURN p.name LIMIT 1";
            long t0 = System.nanoTime();
            e.run(Request.of(new CypherParser().parse(first).tree(), first, schema, Limits.defaults()));
            System.out.printf("1M nodes: first labelled query, with the label index built, %.0f ms%n", (System.nanoTime() - t0) / 1e6);
            for (String text : List.of("MATCH (p:Port) WHERE p.unlocode STARTS WITH 'XX12' RETURN p.name", "MATCH (p:Port) RETURN p.name",
                    "MATCH (v:Vessel) WHERE v.yearBuilt >= 2020 RETURN v.name",
                    "MATCH (voy:Voyage) RETURN count(voy)", "MATCH (pc:PortCall) RETURN count(pc)", CALLS_BY_PORT)) {
                Request req = Request.of(new CypherParser().parse(text).tree(), text, schema,
                        Limits.unlimitedRows(java.time.Duration.ofMinutes(5)));
                double[] medians = onAndOff(EngineSwitches::labelIndex, e, req, 3, 9);
                System.out.printf("1M nodes: %s%n  label index %.1f ms median, label scan %.1f ms median; load average %.2f%n",
                        text, medians[0], medians[1], loadAverage());
            }
        }
    }

    /**
     * The basis of the label index's threshold (GraphPort.SELECTIVE), in TinkerPop alone: counting a label's vertices
     * looked up by id against testing every vertex's label, for labels of 1% to 59% of the graph, three times each.
     */
    private static void countByIdAndByScan(TinkerGraph g) {
        var s = g.traversal();
        java.util.Map<String, List<Object>> ids = new java.util.HashMap<>();
        g.vertices().forEachRemaining(v -> ids.computeIfAbsent(v.label(), k -> new java.util.ArrayList<>()).add(v.id()));
        for (String[] labels : new String[][] {{"Port"}, {"ContainerShip", "Tanker", "BulkCarrier"}, {"Voyage"}, {"PortCall"}}) {
            Object[] of = java.util.Arrays.stream(labels).flatMap(l -> ids.get(l).stream()).toArray();
            StringBuilder line = new StringBuilder(String.format("1M nodes: count %s (%.0f%%), by id / by scan:",
                    String.join("|", labels), 100.0 * of.length / g.traversal().V().count().next()));
            for (int rep = 0; rep < 3; rep++) {
                long t0 = System.nanoTime();
                s.V(of).hasLabel(org.apache.tinkerpop.gremlin.process.traversal.P.within(labels)).count().next();
                long t1 = System.nanoTime();
                s.V().hasLabel(org.apache.tinkerpop.gremlin.process.traversal.P.within(labels)).count().next();
                line.append(String.format(" %.0f / %.0f ms;", (t1 - t0) / 1e6, (System.nanoTime() - t1) / 1e6));
            }
            System.out.println(line);
        }
    }

    /** The case the pushdown is for: a remote server, where the client-only path fetches every matched row. */
    @Test
    void pushedAggregateOnARemoteServerWith100kNodes() throws Exception {
        TinkerGraph g = ScaleGraph.generate(100_000, 42);
        Request req = Request.of(new CypherParser().parse(CALLS_BY_PORT).tree(), CALLS_BY_PORT, GraphSchema.empty(),
                Limits.defaults().withTimeout(java.time.Duration.ofMinutes(5)));
        try (InProcessServer server = InProcessServer.start(g); Engine e = server.engine()) {
            double[] medians = pushedAndClientOnly(e, req, 2, 5);
            System.out.printf("100k nodes, in-process Gremlin Server: %s%n  projection pushed %.1f ms median, client-only "
                    + "%.1f ms median; load average %.2f%n", CALLS_BY_PORT, medians[0], medians[1], loadAverage());
        }
    }

    @Test
    void reload1MNodesFromTheGraphFile() throws Exception {
        TinkerGraph g = ScaleGraph.generate(1_000_000, 42);
        long rels = g.traversal().E().count().next();
        Path file = Files.createTempFile("bench", ".tgraph");
        long w = System.nanoTime();
        GraphIo.writeBinary(g, file);
        w = System.nanoTime() - w;
        g = null;
        System.gc();
        long t0 = System.nanoTime();
        try (Engine e = GraphFiles.open(List.of(file), GraphSchema.empty()).engine()) {
            double s = (System.nanoTime() - t0) / 1e9;
            System.gc();
            long used = Runtime.getRuntime().totalMemory() - Runtime.getRuntime().freeMemory();
            System.out.printf("1M nodes / %d relationships: reload %.1f s, heap after load %d MB (max heap %d MB), file %d MB "
                    + "written in %.1f s; load average %.2f%n", rels, s, used >> 20, Runtime.getRuntime().maxMemory() >> 20,
                    Files.size(file) >> 20, w / 1e9, loadAverage());
        } finally {
            Files.deleteIfExists(file);
        }
    }

    /** Figures taken while other work runs are inflated; the load average says how much. */
    private static double loadAverage() {
        return java.lang.management.ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
    }

    private static double median(long[] xs) {
        long[] c = xs.clone();
        Arrays.sort(c);
        return c[c.length / 2];
    }
}
