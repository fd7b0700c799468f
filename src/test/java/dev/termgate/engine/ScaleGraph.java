package dev.termgate.engine;

import dev.termgate.graph.GraphBuilder;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.time.LocalDate;
import java.util.List;
import java.util.Map;
import java.util.Random;

/**
 * A seeded generator of the demo scenario at scale: carriers, vessels (with subclasses), ports, voyages and
 * port calls with the demo's labels, relationship types and property keys; about three relationships per node.
 */
public final class ScaleGraph {
    private ScaleGraph() {}

    public static TinkerGraph generate(int nodes, long seed) {
        Random rnd = new Random(seed);
        GraphBuilder b = new GraphBuilder();
        int carriers = Math.max(10, nodes / 100), ports = Math.max(10, nodes / 100), vessels = nodes / 10;
        int voyages = (nodes - carriers - ports - vessels) / 3;
        int calls = nodes - carriers - ports - vessels - voyages;
        Object[] c = new Object[carriers], p = new Object[ports], v = new Object[vessels], voy = new Object[voyages];
        for (int i = 0; i < carriers; i++) c[i] = b.addNode(List.of("Carrier"), Map.of("name", "Carrier " + i));
        for (int i = 0; i < ports; i++) p[i] = b.addNode(List.of("Port"), Map.of("name", "Port " + i, "unlocode", "XX" + i));
        String[] kinds = {"ContainerShip", "Tanker", "BulkCarrier"};
        for (int i = 0; i < vessels; i++) {
            v[i] = b.addNode(List.of(kinds[i % 3]), Map.of("name", "Vessel " + i, "yearBuilt", 1980L + rnd.nextInt(45),
                    "dwt", 5000.0 + rnd.nextInt(200_000)));
            b.addRelationship(v[i], c[rnd.nextInt(carriers)], "OPERATED_BY", Map.of());
        }
        LocalDate start = LocalDate.of(2022, 1, 1);
        for (int i = 0; i < voyages; i++) {
            voy[i] = b.addNode(List.of("Voyage"), Map.of("voyageNumber", "V" + i, "departureDate", start.plusDays(rnd.nextInt(1100))));
            b.addRelationship(voy[i], v[rnd.nextInt(vessels)], "PERFORMED_BY", Map.of());
            b.addRelationship(voy[i], p[rnd.nextInt(ports)], "DEPARTS_FROM", Map.of());
        }
        Object previous = null;
        for (int i = 0; i < calls; i++) {
            Object pc = b.addNode(List.of("PortCall"), Map.of("callNumber", (long) i));
            b.addRelationship(voy[rnd.nextInt(voyages)], pc, "HAS_PORT_CALL", Map.of());
            b.addRelationship(pc, p[rnd.nextInt(ports)], "AT_PORT", Map.of());
            b.addRelationship(pc, c[rnd.nextInt(carriers)], "HANDLED_BY", Map.of());
            if (previous != null) b.addRelationship(previous, pc, "NEXT_CALL", Map.of());
            previous = pc;
        }
        return b.graph();
    }
}
