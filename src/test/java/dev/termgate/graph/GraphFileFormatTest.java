package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.Edge;
import org.apache.tinkerpop.gremlin.structure.T;
import org.apache.tinkerpop.gremlin.structure.Vertex;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.DataOutputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.LocalTime;
import java.time.OffsetTime;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.ZoneId;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The graph file gives back exactly what was written (common practice for a storage format), and refuses what it cannot read. */
class GraphFileFormatTest {
    @TempDir
    Path dir;

    private static TinkerGraph sample() {
        TinkerGraph g = TinkerGraph.open();
        Vertex a = g.addVertex(T.id, 7L, T.label, "Vessel::Tanker", "name", "Ärdent ⛴", "dwt", -0.0, "big", Long.MIN_VALUE,
                "max", Long.MAX_VALUE, "nan", Double.NaN, "ok", true, "no", false, "empty", "",
                "tags", List.of("x", List.of(1L, 2.5), true));
        Vertex b = g.addVertex(T.id, "carrier-b", T.label, "Carrier", "founded", LocalDate.of(1, 1, 1),
                "before1970", LocalDate.of(1899, 12, 31), "at", LocalDateTime.of(2024, 2, 29, 23, 59, 58, 123_000_000),
                "zoned", ZonedDateTime.of(2024, 3, 1, 8, 0, 0, 0, ZoneId.of("Europe/Oslo")),
                "time", LocalTime.of(12, 30), "otime", OffsetTime.of(1, 2, 3, 0, ZoneOffset.ofHours(-5)));
        Vertex c = g.addVertex(T.id, 9L, T.label, "vertex");
        a.addEdge("OPERATED_BY", b, T.id, 100L, "since", 2020L, "share", 0.25);
        b.addEdge("SELF", b, T.id, 101L);
        c.addEdge("OPERATED_BY", a, T.id, "e-2");
        return g;
    }

    private static Map<Object, String> dump(TinkerGraph g) {
        Map<Object, String> out = new HashMap<>();
        g.traversal().V().elementMap().forEachRemaining(m -> out.put(m.get(T.id), m.toString()));
        g.traversal().E().elementMap().forEachRemaining(m -> out.put("e:" + m.get(T.id), m.toString()));
        return out;
    }

    @Test
    void everyValueKindLabelAndIdSurvivesTheRoundTrip() {
        TinkerGraph g = sample();
        Path f = dir.resolve("g.tgraph");
        GraphIo.writeBinary(g, f);
        TinkerGraph back = GraphIo.readBinary(f);
        assertEquals(dump(g), dump(back));
        Object nan = back.traversal().V(7L).values("nan").next();
        assertTrue(nan instanceof Double d && d.isNaN());
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits((Double) back.traversal().V(7L).values("dwt").next()));
    }

    @Test
    void anEmptyGraphRoundTrips() {
        Path f = dir.resolve("empty.tgraph");
        GraphIo.writeBinary(TinkerGraph.open(), f);
        assertEquals(0L, GraphIo.readBinary(f).traversal().V().count().next());
    }

    @Test
    void aFileOfTheFirstFormatIsRefusedWithAdvice() throws IOException {
        Path f = dir.resolve("old.tgraph");
        try (DataOutputStream out = new DataOutputStream(Files.newOutputStream(f))) {
            out.writeInt(0x54474731); // "TGG1", the first format's magic
            out.writeLong(0);
            out.writeLong(0);
        }
        ImportException e = assertThrows(ImportException.class, () -> GraphIo.readBinary(f));
        assertTrue(e.getMessage().contains("older termgate (format 1)") && e.getMessage().contains("termgate import"), e.getMessage());
    }

    @Test
    void truncatedOrForeignFilesAreRefused() throws IOException {
        Path good = dir.resolve("g.tgraph");
        GraphIo.writeBinary(sample(), good);
        byte[] bytes = Files.readAllBytes(good);
        Path cut = Files.write(dir.resolve("cut.tgraph"), Arrays.copyOf(bytes, bytes.length - 5));
        ImportException e = assertThrows(ImportException.class, () -> GraphIo.readBinary(cut));
        assertTrue(e.getMessage().contains("ends too early"), e.getMessage());
        Path text = Files.writeString(dir.resolve("text.tgraph"), "CREATE (a)");
        ImportException e2 = assertThrows(ImportException.class, () -> GraphIo.readBinary(text));
        assertTrue(e2.getMessage().contains("not a termgate graph file"), e2.getMessage());
        byte[] later = bytes.clone();
        later[4] = 3; // a format this termgate does not know
        Path newer = Files.write(dir.resolve("newer.tgraph"), later);
        ImportException e3 = assertThrows(ImportException.class, () -> GraphIo.readBinary(newer));
        assertTrue(e3.getMessage().contains("format 3"), e3.getMessage());
    }
}
