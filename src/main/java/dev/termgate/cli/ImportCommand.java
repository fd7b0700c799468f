package dev.termgate.cli;

import dev.termgate.engine.GraphFiles;
import dev.termgate.graph.ImportException;
import dev.termgate.schema.GraphSchema;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;

/** {@code termgate import}: read data once and write a graph file that later runs open fast. */
@Command(name = "import", mixinStandardHelpOptions = true,
        description = "Import data (RDF through the ontology, CSV, GraphML, openCypher CREATE scripts) into a graph file for --graph.")
public final class ImportCommand implements Callable<Integer> {

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Mixin
    OntologyOptions ontology;

    @Parameters(arity = "1..*", paramLabel = "INPUT", description = "data files (.ttl .nt .jsonld … .csv .graphml .cypher) or directories of CSV files")
    List<Path> inputs;

    @Option(names = {"-o", "--output"}, required = true, paramLabel = "FILE", description = "the graph file to write: .tgraph (fast to reload) or .graphml")
    Path output;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        boolean rdf = inputs.stream().anyMatch(p -> p.toString().matches("(?i).*\\.(ttl|nt|nq|trig|jsonld|rdf|owl|n3)$"));
        GraphSchema schema = rdf ? ontology.schema(err) : GraphSchema.empty();
        long t0 = System.nanoTime();
        GraphFiles.Loaded loaded;
        try {
            loaded = GraphFiles.importTo(inputs, schema, output);
        } catch (ImportException e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        }
        try (var engine = loaded.engine()) {
            loaded.problems().forEach(d -> err.println("termgate: " + d.severity().word() + " " + d.code().id() + ": " + d.fullMessage()));
            out.printf("wrote %s: %d nodes, %d relationships (%.1f s)%n", output, loaded.nodes(), loaded.relationships(),
                    (System.nanoTime() - t0) / 1e9);
        }
        return Exit.OK;
    }
}
