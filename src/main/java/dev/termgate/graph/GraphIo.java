package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLReader;
import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLWriter;
import org.apache.tinkerpop.gremlin.structure.io.gryo.GryoReader;
import org.apache.tinkerpop.gremlin.structure.io.gryo.GryoWriter;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.io.BufferedInputStream;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * TinkerPop graph files: GraphML for exchange, and Gryo ({@code .kryo}) as termgate's imported graph file —
 * TinkerPop's binary format, the fastest of its formats to read back into TinkerGraph.
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

    public static TinkerGraph readBinary(Path file) {
        TinkerGraph g = TinkerGraph.open();
        try (InputStream in = new BufferedInputStream(Files.newInputStream(file), 1 << 16)) {
            GryoReader.build().create().readGraph(in, g);
        } catch (IOException | RuntimeException e) {
            throw new ImportException("cannot read graph file " + file + ": " + message(e), e);
        }
        return g;
    }

    public static void writeBinary(TinkerGraph g, Path file) {
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(file), 1 << 16)) {
            GryoWriter.build().create().writeGraph(out, g);
        } catch (IOException e) {
            throw new ImportException("cannot write " + file + ": " + message(e), e);
        }
    }

    private static String message(Exception e) {
        Throwable r = e;
        while (r.getCause() != null) r = r.getCause();
        return r.getMessage() == null ? r.getClass().getSimpleName() : r.getMessage();
    }
}
