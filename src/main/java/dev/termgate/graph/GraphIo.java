package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLReader;
import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLWriter;
import org.apache.tinkerpop.gremlin.structure.Edge;
import org.apache.tinkerpop.gremlin.structure.Property;
import org.apache.tinkerpop.gremlin.structure.T;
import org.apache.tinkerpop.gremlin.structure.Vertex;
import org.apache.tinkerpop.gremlin.structure.VertexProperty;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.io.BufferedInputStream;
import java.io.BufferedOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.LocalTime;
import java.time.OffsetDateTime;
import java.time.OffsetTime;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Graph files: GraphML (TinkerPop IO) for exchange, and termgate's own binary graph file ({@code .tgraph}) for
 * fast reloading. TinkerPop's Gryo was the first choice, but its Kryo serializers need reflective access that
 * Java 17 refuses without {@code --add-opens}; a plain typed dump reloads just as fast.
 */
public final class GraphIo {
    private GraphIo() {}

    public static TinkerGraph readGraphMl(Path file) {
        TinkerGraph g = TinkerGraph.open();
        try (InputStream in = new BufferedInputStream(Files.newInputStream(file))) {
            GraphMLReader.build().create().readGraph(in, g);
        } catch (IOException | RuntimeException e) {
            throw new ImportException("cannot read GraphML " + file + ": " + message(e), e);
        }
        return g;
    }

    public static void writeGraphMl(TinkerGraph g, Path file) {
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(file))) {
            GraphMLWriter.build().normalize(true).create().writeGraph(out, g);
        } catch (IOException e) {
            throw new ImportException("cannot write " + file + ": " + message(e), e);
        }
    }

    private static final int MAGIC = 0x54474731; // "TGG1"

    /**
     * Reads termgate's graph file: a compact binary dump of vertices and edges with their ids, labels and
     * typed properties (see {@link #writeBinary}). Written by {@code termgate import}; fastest to reload.
     */
    public static TinkerGraph readBinary(Path file) {
        TinkerGraph g = TinkerGraph.open();
        try (DataInputStream in = new DataInputStream(new BufferedInputStream(Files.newInputStream(file), 1 << 16))) {
            if (in.readInt() != MAGIC) throw new ImportException(file + " is not a termgate graph file");
            long nv = in.readLong();
            for (long i = 0; i < nv; i++) {
                long id = in.readLong();
                Vertex v = g.addVertex(T.id, id, T.label, in.readUTF());
                int np = in.readInt();
                for (int k = 0; k < np; k++) v.property(in.readUTF(), readValue(in));
            }
            long ne = in.readLong();
            for (long i = 0; i < ne; i++) {
                long id = in.readLong();
                Vertex from = g.vertices(in.readLong()).next();
                Vertex to = g.vertices(in.readLong()).next();
                Edge e = from.addEdge(in.readUTF(), to, T.id, id);
                int np = in.readInt();
                for (int k = 0; k < np; k++) e.property(in.readUTF(), readValue(in));
            }
        } catch (IOException | RuntimeException e) {
            if (e instanceof ImportException ie) throw ie;
            throw new ImportException("cannot read graph file " + file + ": " + message(e), e);
        }
        return g;
    }

    @SuppressWarnings("unchecked")
    public static void writeBinary(TinkerGraph g, Path file) {
        try (DataOutputStream out = new DataOutputStream(new BufferedOutputStream(Files.newOutputStream(file), 1 << 16))) {
            out.writeInt(MAGIC);
            out.writeLong(g.traversal().V().count().next());
            for (Iterator<Vertex> it = g.vertices(); it.hasNext(); ) {
                Vertex v = it.next();
                out.writeLong(((Number) v.id()).longValue());
                out.writeUTF(v.label());
                List<VertexProperty<Object>> props = new ArrayList<>();
                v.properties().forEachRemaining(p -> props.add((VertexProperty<Object>) p));
                out.writeInt(props.size());
                for (VertexProperty<Object> p : props) {
                    out.writeUTF(p.key());
                    writeValue(out, p.value());
                }
            }
            out.writeLong(g.traversal().E().count().next());
            for (Iterator<Edge> it = g.edges(); it.hasNext(); ) {
                Edge e = it.next();
                out.writeLong(((Number) e.id()).longValue());
                out.writeLong(((Number) e.outVertex().id()).longValue());
                out.writeLong(((Number) e.inVertex().id()).longValue());
                out.writeUTF(e.label());
                List<Property<Object>> props = new ArrayList<>();
                e.properties().forEachRemaining(p -> props.add((Property<Object>) p));
                out.writeInt(props.size());
                for (Property<Object> p : props) {
                    out.writeUTF(p.key());
                    writeValue(out, p.value());
                }
            }
        } catch (IOException | ClassCastException e) {
            throw new ImportException("cannot write " + file + ": " + message(e), e);
        }
    }

    private static void writeValue(DataOutputStream out, Object v) throws IOException {
        if (v instanceof String s) {
            out.writeByte(1);
            byte[] b = s.getBytes(StandardCharsets.UTF_8);
            out.writeInt(b.length);
            out.write(b);
        } else if (v instanceof Long || v instanceof Integer || v instanceof Short || v instanceof Byte) {
            out.writeByte(2);
            out.writeLong(((Number) v).longValue());
        } else if (v instanceof Double || v instanceof Float) {
            out.writeByte(3);
            out.writeDouble(((Number) v).doubleValue());
        } else if (v instanceof Boolean b) {
            out.writeByte(4);
            out.writeBoolean(b);
        } else if (v instanceof List<?> l) {
            out.writeByte(5);
            out.writeInt(l.size());
            for (Object o : l) writeValue(out, o);
        } else if (v instanceof LocalDate d) {
            out.writeByte(6);
            out.writeLong(d.toEpochDay());
        } else if (v instanceof LocalDateTime t) {
            out.writeByte(7);
            out.writeUTF(t.toString());
        } else if (v instanceof ZonedDateTime z) {
            out.writeByte(8);
            out.writeUTF(z.toString());
        } else if (v instanceof OffsetDateTime z) {
            out.writeByte(8);
            out.writeUTF(z.toZonedDateTime().toString());
        } else if (v instanceof LocalTime t) {
            out.writeByte(9);
            out.writeUTF(t.toString());
        } else if (v instanceof OffsetTime t) {
            out.writeByte(10);
            out.writeUTF(t.toString());
        } else if (v == null) {
            out.writeByte(0);
        } else {
            writeValue(out, v.toString());
        }
    }

    private static Object readValue(DataInputStream in) throws IOException {
        int tag = in.readByte();
        return switch (tag) {
            case 0 -> null;
            case 1 -> {
                byte[] b = new byte[in.readInt()];
                in.readFully(b);
                yield new String(b, StandardCharsets.UTF_8);
            }
            case 2 -> in.readLong();
            case 3 -> in.readDouble();
            case 4 -> in.readBoolean();
            case 5 -> {
                int n = in.readInt();
                List<Object> l = new ArrayList<>(n);
                for (int i = 0; i < n; i++) l.add(readValue(in));
                yield l;
            }
            case 6 -> LocalDate.ofEpochDay(in.readLong());
            case 7 -> LocalDateTime.parse(in.readUTF());
            case 8 -> ZonedDateTime.parse(in.readUTF());
            case 9 -> LocalTime.parse(in.readUTF());
            case 10 -> OffsetTime.parse(in.readUTF());
            default -> throw new IOException("unknown value tag " + tag + " (corrupt file?)");
        };
    }

    private static String message(Exception e) {
        Throwable r = e;
        while (r.getCause() != null) r = r.getCause();
        return r.getMessage() == null ? r.getClass().getSimpleName() : r.getMessage();
    }
}
