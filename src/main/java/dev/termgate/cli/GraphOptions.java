package dev.termgate.cli;

import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.translate.RunLimits;
import picocli.CommandLine.Option;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Optional;

/** Which graph a question is asked of, and the limits of a run; shared by ask, shell and batch. */
public final class GraphOptions {

    @Option(names = "--schema-free", description = "use no ontology: every label, type and property is accepted")
    boolean schemaFree;

    @Option(names = "--graph", paramLabel = "FILE", description = "the graph to run on (default: the bundled demo graph)")
    Path graph;

    @Option(names = "--remote", paramLabel = "URL", description = "run on a Gremlin Server, e.g. ws://HOST:8182/gremlin")
    String remote;

    @Option(names = "--budget", paramLabel = "TOKENS", defaultValue = "" + PipelineSpec.DEFAULT_BUDGET,
            description = "token budget of the schema card (default: ${DEFAULT-VALUE})")
    int budget;

    @Option(names = "--timeout", paramLabel = "SECONDS", defaultValue = "30", description = "time limit of a run (default: ${DEFAULT-VALUE})")
    double timeout;

    @Option(names = "--max-rows", paramLabel = "N", defaultValue = "1000", description = "row cap of a run (default: ${DEFAULT-VALUE})")
    int maxRows;

    /** Checks the options and loads the ontology (unless schema-free). */
    PipelineSpec spec(OntologyOptions ontology, java.io.PrintWriter err) {
        if (graph != null && remote != null) throw new UserError(Exit.USAGE, "give either --graph or --remote, not both");
        if (schemaFree && !ontology.sources().isEmpty()) throw new UserError(Exit.USAGE, "give either --ontology or --schema-free, not both");
        if (budget < 50) throw new UserError(Exit.USAGE, "--budget must be at least 50 tokens");
        GraphSchema schema = schemaFree ? GraphSchema.empty() : ontology.schema(err);
        return new PipelineSpec(schema, schemaFree, Optional.ofNullable(graph), Optional.ofNullable(remote), budget);
    }

    RunLimits limits() {
        if (!(timeout > 0)) throw new UserError(Exit.USAGE, "--timeout must be positive");
        if (maxRows < 1) throw new UserError(Exit.USAGE, "--max-rows must be at least 1");
        return new RunLimits(Duration.ofMillis(Math.round(timeout * 1000)), maxRows);
    }
}
