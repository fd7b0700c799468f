package dev.termgate.ontology;

import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.GraphSchema;

import java.util.List;

/**
 * An ontology read and turned into a graph schema.
 *
 * @param schema      the derived schema (its {@link GraphSchema#issues()} hold the derivation warnings)
 * @param problems    everything worth telling the user: loading warnings (unresolved imports, parser
 *                    warnings) followed by the schema's issues
 * @param contentHash SHA-256 (hex) of the sources' content, naming style and cache format version
 * @param fromCache   whether the schema was read from the on-disk cache rather than derived
 * @param sources     the sources as given (the demo ontology's resource name when none was given)
 */
public record LoadedOntology(GraphSchema schema, List<Diagnostic> problems, String contentHash, boolean fromCache,
                             List<String> sources) {
    public LoadedOntology {
        problems = List.copyOf(problems);
        sources = List.copyOf(sources);
    }
}
