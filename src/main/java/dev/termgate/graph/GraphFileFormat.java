package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.Edge;
import org.apache.tinkerpop.gremlin.structure.Property;
import org.apache.tinkerpop.gremlin.structure.T;
import org.apache.tinkerpop.gremlin.structure.Vertex;
import org.apache.tinkerpop.gremlin.structure.VertexProperty;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.LocalTime;
import java.time.OffsetDateTime;
import java.time.OffsetTime;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * termgate's graph file ({@code .tgraph}), format 2. Everything is written once and read back in one pass with
 * no lookups: a string table first, so that every label, key and string value is read once and shared by all
 * the elements that use it; then the vertices in order; then the edges, whose ends are vertex ordinals (their
 * position in the file), not ids, so reading an edge needs no search.
 *
 * <pre>
 * file      = magic "TGRF" (4 bytes), version (varint, 2), strings, vertices, edges
 * strings   = count, count × (byte length, UTF-8 bytes)
 * vertices  = count, count × (id value, label string, properties)
 * edges     = count, count × (id value, out-vertex ordinal, in-vertex ordinal, label string, properties)
 * properties= count, count × (key string, value)
 * value     = tag byte, then: 0 null | 1 string | 2 integer (zigzag varint) | 3 float (8 bytes IEEE) | 4 false
 *             | 5 true | 6 list (count, values) | 7 date (zigzag varint epoch day) | 8 local date-time | 9 zoned
 *             date-time | 10 local time | 11 offset time   (8–11 as ISO text, a string)
 * </pre>
 * Counts, lengths, ordinals and string references are unsigned varints (7 bits a byte, low bits first). Format 1
 * (magic "TGG1", fixed-width, strings inline) is refused with a message saying to import again.
 */
final class GraphFileFormat {
    static final int MAGIC = 0x54475246; // "TGRF"
    static final int VERSION = 2;
    static final int OLD_MAGIC = 0x54474731; // "TGG1", format 1

    private GraphFileFormat() {}

    // ---------------------------------------------------------------- writing

    static void write(TinkerGraph g, OutputStream os) throws IOException {
        Map<String, Integer> strings = new LinkedHashMap<>();
        Map<Object, Integer> ordinals = new HashMap<>();
        for (Iterator<Vertex> it = g.vertices(); it.hasNext(); ) {
            Vertex v = it.next();
            ordinals.put(v.id(), ordinals.size());
            collect(strings, v.id());
            strings.putIfAbsent(v.label(), strings.size());
            for (Iterator<VertexProperty<Object>> ps = v.properties(); ps.hasNext(); ) {
                VertexProperty<Object> p = ps.next();
                strings.putIfAbsent(p.key(), strings.size());
                collect(strings, p.value());
            }
        }
        long edges = 0;
        for (Iterator<Edge> it = g.edges(); it.hasNext(); edges++) {
            Edge e = it.next();
            collect(strings, e.id());
            strings.putIfAbsent(e.label(), strings.size());
            for (Iterator<Property<Object>> ps = e.properties(); ps.hasNext(); ) {
                Property<Object> p = ps.next();
                strings.putIfAbsent(p.key(), strings.size());
                collect(strings, p.value());
            }
        }
        Encoder out = new Encoder(os, strings);
        out.fixedInt(MAGIC);
        out.varint(VERSION);
        out.varint(strings.size());
        for (String s : strings.keySet()) {
            byte[] b = s.getBytes(StandardCharsets.UTF_8);
            out.varint(b.length);
            out.bytes(b);
        }
        out.varint(ordinals.size());
        for (Iterator<Vertex> it = g.vertices(); it.hasNext(); ) {
            Vertex v = it.next();
            out.value(v.id());
            out.string(v.label());
            List<VertexProperty<Object>> props = new ArrayList<>();
            v.<Object>properties().forEachRemaining(props::add);
            out.varint(props.size());
            for (VertexProperty<Object> p : props) {
                out.string(p.key());
                out.value(p.value());
            }
        }
        out.varint(edges);
        for (Iterator<Edge> it = g.edges(); it.hasNext(); ) {
            Edge e = it.next();
            out.value(e.id());
            out.varint(ordinals.get(e.outVertex().id()));
            out.varint(ordinals.get(e.inVertex().id()));
            out.string(e.label());
            List<Property<Object>> props = new ArrayList<>();
            e.<Object>properties().forEachRemaining(props::add);
            out.varint(props.size());
            for (Property<Object> p : props) {
                out.string(p.key());
                out.value(p.value());
            }
        }
        out.flush();
    }

    /** Puts every string a value will be written as into the table. */
    private static void collect(Map<String, Integer> strings, Object v) {
        if (v instanceof List<?> l) {
            for (Object o : l) collect(strings, o);
        } else if (v != null && !(v instanceof Number || v instanceof Boolean || v instanceof LocalDate)) {
            strings.putIfAbsent(Encoder.text(v), strings.size());
        }
    }

    /** Buffered, unsynchronized output of varints and table references. */
    private static final class Encoder {
        private final OutputStream os;
        private final Map<String, Integer> strings;
        private final byte[] buf = new byte[1 << 16];
        private int pos;

        Encoder(OutputStream os, Map<String, Integer> strings) {
            this.os = os;
            this.strings = strings;
        }

        void byte1(int b) throws IOException {
            if (pos == buf.length) flushBuffer();
            buf[pos++] = (byte) b;
        }

        void bytes(byte[] b) throws IOException {
            for (byte x : b) byte1(x);
        }

        void fixedInt(int v) throws IOException {
            byte1(v >>> 24);
            byte1(v >>> 16);
            byte1(v >>> 8);
            byte1(v);
        }

        void varint(long v) throws IOException {
            while ((v & ~0x7FL) != 0) {
                byte1((int) ((v & 0x7F) | 0x80));
                v >>>= 7;
            }
            byte1((int) v);
        }

        void string(String s) throws IOException {
            varint(strings.get(s));
        }

        /** Temporal values and any other kind are stored as their ISO text, like strings. */
        static String text(Object v) {
            if (v instanceof OffsetDateTime o) return o.toZonedDateTime().toString();
            return v.toString();
        }

        void value(Object v) throws IOException {
            if (v == null) {
                byte1(0);
            } else if (v instanceof Long || v instanceof Integer || v instanceof Short || v instanceof Byte) {
                long l = ((Number) v).longValue();
                byte1(2);
                varint((l << 1) ^ (l >> 63));
            } else if (v instanceof Double || v instanceof Float) {
                byte1(3);
                long bits = Double.doubleToRawLongBits(((Number) v).doubleValue());
                for (int i = 56; i >= 0; i -= 8) byte1((int) (bits >>> i));
            } else if (v instanceof Boolean b) {
                byte1(b ? 5 : 4);
            } else if (v instanceof List<?> l) {
                byte1(6);
                varint(l.size());
                for (Object o : l) value(o);
            } else if (v instanceof LocalDate d) {
                long day = d.toEpochDay();
                byte1(7);
                varint((day << 1) ^ (day >> 63));
            } else {
                byte1(v instanceof LocalDateTime ? 8 : v instanceof ZonedDateTime || v instanceof OffsetDateTime ? 9
                        : v instanceof LocalTime ? 10 : v instanceof OffsetTime ? 11 : 1);
                string(text(v));
            }
        }

        void flush() throws IOException {
            flushBuffer();
            os.flush();
        }

        private void flushBuffer() throws IOException {
            os.write(buf, 0, pos);
            pos = 0;
        }
    }

    // ---------------------------------------------------------------- reading

    /**
     * Adds the file's vertices and edges to an empty graph through TinkerGraph's element API directly (no
     * traversal per element): ids, labels and properties as written.
     */
    static void read(InputStream is, TinkerGraph g, String file) throws IOException {
        Decoder in = new Decoder(is);
        int magic = in.fixedInt();
        if (magic == OLD_MAGIC) {
            throw new ImportException(file + " is a graph file of an older termgate (format 1); import the data again "
                    + "with 'termgate import' to rebuild it");
        }
        if (magic != MAGIC) throw new ImportException(file + " is not a termgate graph file");
        long version = in.varint();
        if (version != VERSION) {
            throw new ImportException(file + " is a termgate graph file of format " + version + "; this termgate reads format "
                    + VERSION + " (import the data again with 'termgate import')");
        }
        String[] strings = new String[in.count()];
        for (int i = 0; i < strings.length; i++) strings[i] = in.utf8(in.count());
        in.strings = strings;
        Vertex[] vertices = new Vertex[in.count()];
        Object[] keyValues = new Object[4];
        for (int i = 0; i < vertices.length; i++) {
            Object id = in.value();
            String label = in.string();
            int np = in.count();
            int need = 4 + 2 * np;
            if (keyValues.length != need) keyValues = new Object[need];
            keyValues[0] = T.id;
            keyValues[1] = id;
            keyValues[2] = T.label;
            keyValues[3] = label;
            for (int k = 0; k < np; k++) {
                keyValues[4 + 2 * k] = in.string();
                keyValues[5 + 2 * k] = in.value();
            }
            vertices[i] = g.addVertex(keyValues);
        }
        long ne = in.varint();
        Object[] noProps = new Object[2];
        for (long i = 0; i < ne; i++) {
            Object id = in.value();
            Vertex from = vertices[in.count()];
            Vertex to = vertices[in.count()];
            String label = in.string();
            int np = in.count();
            // Most edges have no properties: their array is reused (TinkerGraph keeps none of it).
            Object[] kv = np == 0 ? noProps : new Object[2 + 2 * np];
            kv[0] = T.id;
            kv[1] = id;
            for (int k = 0; k < np; k++) {
                kv[2 + 2 * k] = in.string();
                kv[3 + 2 * k] = in.value();
            }
            from.addEdge(label, to, kv);
        }
        if (is.read() != -1) throw new IOException("data after the last edge (corrupt file?)");
    }

    /** Buffered, unsynchronized input: the reader's inner loop reads bytes one by one. */
    private static final class Decoder {
        private final InputStream is;
        private final byte[] buf = new byte[1 << 16];
        private int pos;
        private int end;
        String[] strings;

        Decoder(InputStream is) {
            this.is = is;
        }

        int byte1() throws IOException {
            if (pos == end) {
                end = is.read(buf, 0, buf.length);
                pos = 0;
                if (end <= 0) {
                    end = 0;
                    throw new EOFException("the file ends too early (truncated?)");
                }
            }
            return buf[pos++] & 0xFF;
        }

        int fixedInt() throws IOException {
            return byte1() << 24 | byte1() << 16 | byte1() << 8 | byte1();
        }

        long varint() throws IOException {
            long v = 0;
            for (int shift = 0; shift < 64; shift += 7) {
                int b = byte1();
                v |= (long) (b & 0x7F) << shift;
                if ((b & 0x80) == 0) return v;
            }
            throw new IOException("malformed number (corrupt file?)");
        }

        int count() throws IOException {
            long v = varint();
            if (v > Integer.MAX_VALUE - 8) throw new IOException("count " + v + " out of range (corrupt file?)");
            return (int) v;
        }

        String utf8(int length) throws IOException {
            byte[] b = new byte[length];
            for (int i = 0; i < length; i++) b[i] = (byte) byte1();
            return new String(b, StandardCharsets.UTF_8);
        }

        String string() throws IOException {
            int i = count();
            if (i >= strings.length) throw new IOException("string reference " + i + " out of range (corrupt file?)");
            return strings[i];
        }

        Object value() throws IOException {
            int tag = byte1();
            return switch (tag) {
                case 0 -> null;
                case 1 -> string();
                case 2 -> unzigzag(varint());
                case 3 -> {
                    long bits = 0;
                    for (int i = 0; i < 8; i++) bits = bits << 8 | byte1();
                    yield Double.longBitsToDouble(bits);
                }
                case 4 -> Boolean.FALSE;
                case 5 -> Boolean.TRUE;
                case 6 -> {
                    int n = count();
                    List<Object> l = new ArrayList<>(n);
                    for (int i = 0; i < n; i++) l.add(value());
                    yield l;
                }
                case 7 -> LocalDate.ofEpochDay(unzigzag(varint()));
                case 8 -> LocalDateTime.parse(string());
                case 9 -> ZonedDateTime.parse(string());
                case 10 -> LocalTime.parse(string());
                case 11 -> OffsetTime.parse(string());
                default -> throw new IOException("unknown value tag " + tag + " (corrupt file?)");
            };
        }

        private static long unzigzag(long v) {
            return (v >>> 1) ^ -(v & 1);
        }
    }
}
