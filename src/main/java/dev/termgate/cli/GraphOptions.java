package dev.termgate.cli;

import dev.termgate.diag.Diagnostic;
import dev.termgate.engine.Limits;
import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.translate.RunLimits;
import picocli.CommandLine.Option;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/** Which graph queries run on, with or without an ontology, and the limits of a run; shared by every command that runs queries. */
public final class GraphOptions {

    @Option(names = "--schema-free", description = "use no ontology: every label, type and property is accepted and matched as written")
    boolean schemaFree;

    @Option(names = "--graph", paramLabel = "FILE", description = "graph to run on (repeatable): .tgraph (from import), .graphml, .cypher, .csv files or a directory of them, RDF data; default: the demo graph")
    List<Path> graphs = new ArrayList<>();

    @Option(names = "--remote", paramLabel = "URL", description = "run on a Gremlin Server, e.g. ws://HOST:8182/gremlin")
    String remote;

    @Option(names = "--traversal-source", paramLabel = "NAME", defaultValue = PipelineSpec.DEFAULT_TRAVERSAL_SOURCE,
            description = "the server's traversal source (default: ${DEFAULT-VALUE})")
    String traversalSource;

    @Option(names = "--timeout", paramLabel = "SECONDS", defaultValue = "30", description = "time limit of each query (default: ${DEFAULT-VALUE})")
    double timeout;

    @Option(names = "--max-rows", paramLabel = "N", defaultValue = "1000", description = "row cap of each query (default: ${DEFAULT-VALUE}); more rows are cut and marked truncated")
    int maxRows;

    /** Checks the options and loads the ontology (unless schema-free); loading problems of the graph go to {@code err}. */
    PipelineSpec spec(OntologyOptions ontology, int cardBudget, PrintWriter err) {
        if (!graphs.isEmpty() && remote != null) throw new UserError(Exit.USAGE, "give either --graph or --remote, not both");
        if (schemaFree && !ontology.sources().isEmpty()) throw new UserError(Exit.USAGE, "give either --ontology or --schema-free, not both");
        GraphSchema ontologySchema = ontology.schema(err);
        GraphSchema schema = schemaFree ? GraphSchema.empty() : ontologySchema;
        return new PipelineSpec(schema, schemaFree, ontologySchema, graphs, Optional.ofNullable(remote), traversalSource,
                cardBudget, d -> warn(err, d), Optional.empty());
    }

    RunLimits limits() {
        if (!(timeout > 0)) throw new UserError(Exit.USAGE, "--timeout must be positive");
        if (maxRows < 1) throw new UserError(Exit.USAGE, "--max-rows must be at least 1");
        return new RunLimits(Duration.ofMillis(Math.round(timeout * 1000)), maxRows);
    }

    /** The engine's limits for one query typed by a person. */
    Limits engineLimits() {
        RunLimits l = limits();
        return new Limits(l.timeout(), l.maxRows(), Limits.DEFAULT_MAX_INTERMEDIATE);
    }

    private static void warn(PrintWriter err, Diagnostic d) {
        err.println("termgate: " + d.severity().word() + " " + d.code().id() + ": " + d.fullMessage());
        err.flush();
    }
}
