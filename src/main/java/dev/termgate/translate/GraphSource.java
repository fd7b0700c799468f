package dev.termgate.translate;

import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.engine.Engines;
import dev.termgate.engine.GraphFiles;
import dev.termgate.graph.ImportException;

import java.time.Duration;

/** Opens the engine a {@link PipelineSpec} names: a Gremlin Server, the graph files given, or the demo graph. */
public final class GraphSource {
    /** How long to wait for a Gremlin Server to accept the connection (common practice for an interactive tool). */
    static final Duration CONNECT_TIMEOUT = Duration.ofSeconds(10);

    private GraphSource() {}

    /**
     * @throws EngineException when the server cannot be reached ({@link EngineException#isServiceFailure()})
     * @throws ImportException when a graph file cannot be read
     */
    public static Engine open(PipelineSpec spec) throws EngineException, ImportException {
        if (spec.remote().isPresent()) return Engines.remote(spec.remote().get(), spec.traversalSource(), CONNECT_TIMEOUT);
        GraphFiles.Loaded loaded = spec.graphs().isEmpty() ? GraphFiles.demo(spec.importSchema())
                : GraphFiles.open(spec.graphs(), spec.importSchema());
        loaded.problems().forEach(spec.loadProblems());
        return loaded.engine();
    }
}
