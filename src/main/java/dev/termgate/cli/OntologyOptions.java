package dev.termgate.cli;

import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Severity;
import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.LoadedOntology;
import dev.termgate.ontology.OntologyException;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.Names;
import picocli.CommandLine.Option;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The ontology options every command shares (a picocli mixin: {@code @Mixin OntologyOptions ontology;}).
 * {@link #load(PrintWriter)} reads the ontology once per command run and maps failures to exit codes.
 */
public final class OntologyOptions {

    @Option(names = "--ontology", paramLabel = "FILE|URL",
            description = "Ontology to use (repeatable): a file (Turtle, RDF/XML, N-Triples, N-Quads, JSON-LD, TriG),"
                    + " an http(s) URL, a TDB2 directory, or sparql:URL. Default: the demo ontology.")
    List<String> ontologies = new ArrayList<>();

    @Option(names = "--sparql", paramLabel = "URL",
            description = "Read the ontology from this SPARQL endpoint (added to --ontology sources).")
    String sparql;

    @Option(names = "--naming", paramLabel = "graph|as-is", converter = StyleConverter.class,
            description = "How IRIs become graph names: graph (labels UpperCamelCase, relationship types"
                    + " UPPER_SNAKE_CASE, property keys lowerCamelCase; default) or as-is (the IRI's local name).")
    Names.Style naming = Names.Style.GRAPH;

    @Option(names = "--no-cache", description = "Derive the schema again instead of reading the on-disk cache.")
    boolean noCache;

    /** Warnings printed in full; the rest are counted. */
    static final int MAX_WARNINGS = 10;

    private LoadedOntology loaded;

    /** The sources in order: every --ontology, then --sparql. Empty means the demo ontology. */
    public List<String> sources() {
        List<String> out = new ArrayList<>(ontologies);
        if (sparql != null && !sparql.isBlank()) out.add("sparql:" + sparql.strip());
        return out;
    }

    public LoadOptions loadOptions() {
        return LoadOptions.defaults().withNaming(naming).withCache(!noCache);
    }

    /**
     * Loads the ontology (once; later calls return the same result), printing its warnings to {@code err}.
     *
     * @throws UserError exit 1 for an invalid or unreadable ontology, exit 3 for a failing SPARQL endpoint or URL
     */
    public LoadedOntology load(PrintWriter err) {
        if (loaded != null) return loaded;
        try {
            loaded = OntologyLoader.load(sources(), loadOptions());
        } catch (OntologyException e) {
            throw new UserError(e.serviceFailure() ? Exit.SERVICE : Exit.INVALID, describe(e.problems()));
        }
        List<Diagnostic> shown = loaded.problems().stream().filter(d -> d.severity() != Severity.INFO).toList();
        // Large vocabularies (schema.org: 43 name collisions) would bury the command's own output.
        for (Diagnostic d : shown.subList(0, Math.min(MAX_WARNINGS, shown.size()))) {
            err.println("termgate: " + d.severity().word() + " " + d.code().id() + ": " + d.fullMessage());
        }
        if (shown.size() > MAX_WARNINGS) {
            err.println("termgate: … and " + (shown.size() - MAX_WARNINGS)
                    + " more ontology warnings");
        }
        return loaded;
    }

    /** The loaded schema; see {@link #load(PrintWriter)}. */
    public GraphSchema schema(PrintWriter err) {
        return load(err).schema();
    }

    private static String describe(List<Diagnostic> problems) {
        StringBuilder sb = new StringBuilder();
        for (Diagnostic d : problems) {
            if (sb.length() > 0) sb.append('\n');
            sb.append(d.severity().word()).append(' ').append(d.code().id()).append(": ").append(d.fullMessage());
        }
        return sb.toString();
    }

    /** Accepts graph, as-is, as_is and asis in any case. */
    static final class StyleConverter implements picocli.CommandLine.ITypeConverter<Names.Style> {
        @Override
        public Names.Style convert(String value) {
            String v = value.strip().toLowerCase(Locale.ROOT).replace("_", "-");
            return switch (v) {
                case "graph" -> Names.Style.GRAPH;
                case "as-is", "asis" -> Names.Style.AS_IS;
                default -> throw new picocli.CommandLine.TypeConversionException(
                        "'" + value + "' is not a naming style; use graph or as-is");
            };
        }
    }
}
