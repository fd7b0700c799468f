package dev.termgate.engine;

import dev.termgate.diag.Diagnostic;
import dev.termgate.graph.CsvImport;
import dev.termgate.graph.GraphBuilder;
import dev.termgate.graph.GraphIo;
import dev.termgate.graph.ImportException;
import dev.termgate.graph.RdfImport;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.stream.Stream;

/**
 * Opens graphs from files, choosing the reader by extension: {@code .tgraph} (an imported graph file),
 * {@code .graphml}/{@code .xml}, {@code .cypher}/{@code .cql} (CREATE scripts), {@code .csv} files or a
 * directory of them, and RDF ({@code .ttl .nt .nq .trig .jsonld .rdf .owl}) mapped through the ontology.
 */
public final class GraphFiles {
    /** The demo data, read from the jar. */
    public static final String DEMO_DATA = "classpath:examples/maritime/data.ttl";

    private GraphFiles() {}

    /** A loaded graph and what the readers reported (unknown terms, skipped values). */
    public record Loaded(Engine engine, long nodes, long relationships, List<Diagnostic> problems) {}

    /** The demo graph: the maritime instance data through the demo ontology's schema. */
    public static Loaded demo(GraphSchema demoSchema) {
        GraphBuilder b = new GraphBuilder();
        List<Diagnostic> problems = RdfImport.load(List.of(demoSource()), demoSchema, b);
        return new Loaded(Engines.embedded(b.graph(), "demo graph (examples/maritime/data.ttl)"), b.nodeCount(),
                b.relationshipCount(), problems);
    }

    /** The demo data as a bare TinkerGraph (to serve it from a Gremlin Server in tests and benchmarks). */
    static TinkerGraph demoGraph(GraphSchema demoSchema) {
        GraphBuilder b = new GraphBuilder();
        RdfImport.load(List.of(demoSource()), demoSchema, b);
        return b.graph();
    }

    private static String demoSource() {
        return DEMO_DATA;
    }

    /** Reads every input into one graph; {@code schema} maps RDF inputs (ignored by the other formats). */
    public static Loaded open(List<Path> inputs, GraphSchema schema) {
        List<Diagnostic> problems = new ArrayList<>();
        TinkerGraph g = read(inputs, schema, problems);
        return loaded(g, describe(inputs), problems);
    }

    private static Loaded loaded(TinkerGraph g, String description, List<Diagnostic> problems) {
        long n = g.traversal().V().count().next();
        long r = g.traversal().E().count().next();
        return new Loaded(Engines.embedded(g, description), n, r, problems);
    }

    private static String describe(List<Path> inputs) {
        return inputs.size() == 1 ? inputs.get(0).toString() : inputs.size() + " files";
    }

    /** Reads the inputs and writes the imported graph file ({@code .tgraph}, or GraphML for {@code .graphml}). */
    public static Loaded importTo(List<Path> inputs, GraphSchema schema, Path output) {
        List<Diagnostic> problems = new ArrayList<>();
        TinkerGraph g = read(inputs, schema, problems);
        String name = output.getFileName().toString().toLowerCase(Locale.ROOT);
        if (name.endsWith(".graphml") || name.endsWith(".xml")) GraphIo.writeGraphMl(g, output);
        else GraphIo.writeBinary(g, output);
        return loaded(g, output.toString(), problems);
    }

    static TinkerGraph read(List<Path> inputs, GraphSchema schema, List<Diagnostic> problems) {
        List<Path> files = new ArrayList<>();
        for (Path p : inputs) {
            if (Files.isDirectory(p)) {
                try (Stream<Path> s = Files.list(p)) {
                    s.filter(f -> f.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".csv")).sorted().forEach(files::add);
                } catch (IOException e) {
                    throw new ImportException("cannot list " + p + ": " + e.getMessage(), e);
                }
            } else if (!Files.isReadable(p)) {
                throw new ImportException("cannot read " + p + ": no such file");
            } else files.add(p);
        }
        List<Path> binary = files.stream().filter(f -> ext(f).equals("tgraph")).toList();
        if (!binary.isEmpty()) {
            if (files.size() > 1) throw new ImportException("an imported graph file (.tgraph) must be opened alone");
            return GraphIo.readBinary(binary.get(0));
        }
        List<Path> graphml = files.stream().filter(f -> ext(f).equals("graphml") || ext(f).equals("xml")).toList();
        if (!graphml.isEmpty()) {
            if (files.size() > 1) throw new ImportException("a GraphML file must be opened alone");
            return GraphIo.readGraphMl(graphml.get(0));
        }
        GraphBuilder b = new GraphBuilder();
        List<Path> csv = new ArrayList<>();
        List<String> rdf = new ArrayList<>();
        for (Path f : files) {
            switch (ext(f)) {
                case "csv" -> csv.add(f);
                case "cypher", "cql" -> {
                    try {
                        CypherScript.load(Files.readString(f, StandardCharsets.UTF_8), b, Map.of());
                    } catch (IOException e) {
                        throw new ImportException("cannot read " + f + ": " + e.getMessage(), e);
                    } catch (ImportException e) {
                        throw new ImportException(f + ": " + e.getMessage(), e);
                    }
                }
                case "ttl", "nt", "nq", "trig", "jsonld", "rdf", "owl", "n3" -> rdf.add(f.toString());
                default -> throw new ImportException(f + ": unknown data format (expected .tgraph, .graphml, .cypher, "
                        + ".csv or RDF: .ttl .nt .nq .trig .jsonld .rdf .owl)");
            }
        }
        if (!csv.isEmpty()) new CsvImport(b).load(csv);
        if (!rdf.isEmpty()) {
            try {
                problems.addAll(RdfImport.load(rdf, schema, b));
            } catch (RuntimeException e) {
                if (e instanceof ImportException) throw e;
                throw new ImportException(e.getMessage(), e);
            }
        }
        return b.graph();
    }

    private static String ext(Path f) {
        String n = f.getFileName().toString().toLowerCase(Locale.ROOT);
        int dot = n.lastIndexOf('.');
        return dot < 0 ? "" : n.substring(dot + 1);
    }
}
