package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLReader;
import org.apache.tinkerpop.gremlin.structure.io.graphml.GraphMLWriter;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.io.BufferedInputStream;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Graph files: GraphML (TinkerPop IO) for exchange, and termgate's own binary graph file ({@code .tgraph}) for
 * fast reloading. TinkerPop's Gryo was the first choice, but its Kryo serializers need reflective access that
 * Java 17 refuses without {@code --add-opens}; a compact typed dump with a string table reloads faster.
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

    /**
     * Reads termgate's graph file ({@link GraphFileFormat}), written by {@code termgate import}; fastest to
     * reload. A file of an older format is refused with a message saying to import again.
     */
    public static TinkerGraph readBinary(Path file) {
        org.apache.commons.configuration2.BaseConfiguration conf = new org.apache.commons.configuration2.BaseConfiguration();
        conf.setProperty(TinkerGraph.GREMLIN_TINKERGRAPH_VERTEX_PROPERTY_ID_MANAGER, PropertyIds.class.getName());
        TinkerGraph g = TinkerGraph.open(conf);
        try (InputStream in = Files.newInputStream(file)) {
            GraphFileFormat.read(in, g, file.toString());
        } catch (IOException | RuntimeException e) {
            if (e instanceof ImportException ie) throw ie;
            throw new ImportException("cannot read graph file " + file + ": " + message(e), e);
        }
        return g;
    }

    public static void writeBinary(TinkerGraph g, Path file) {
        try (OutputStream out = Files.newOutputStream(file)) {
            GraphFileFormat.write(g, out);
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
