package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.SchemaJson;
import org.apache.jena.graph.Node;
import org.apache.jena.graph.Triple;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * The public entry of this package: reads ontology sources and derives the graph schema.
 *
 * <p>A source is a file path or {@code file:} IRI (Turtle, RDF/XML, N-Triples, N-Quads, JSON-LD, TriG; the syntax
 * comes from the extension; quads of all graphs are merged), an {@code http(s)} URL (syntax from the content
 * type), a directory holding a TDB2 database (read only), {@code sparql:URL} for a SPARQL endpoint (the schema
 * statements are fetched with a CONSTRUCT query), or {@code classpath:PATH}. All sources are merged into one
 * ontology. {@code owl:imports} of an ontology given as another source is satisfied by it; an import naming a
 * local file is read too; any other import is reported ({@link Code#IMPORT_NOT_LOADED}) and not fetched.
 *
 * <p>With no sources the demo ontology {@value #DEMO} is read from the class path.
 */
public final class OntologyLoader {

    /** The demo ontology, packaged in the jar from {@code examples/}. */
    public static final String DEMO = SourceReader.CLASSPATH_PREFIX + "examples/maritime/ontology.ttl";

    private OntologyLoader() {}

    /**
     * @throws OntologyException when a source cannot be read or parsed, holds nothing, or a SPARQL endpoint or
     *                           URL fails ({@link OntologyException#serviceFailure()})
     */
    public static LoadedOntology load(List<String> sources, LoadOptions opts) {
        List<String> given = sources.isEmpty() ? List.of(DEMO) : List.copyOf(sources);
        boolean cacheable = given.stream().allMatch(SourceReader::isContent);
        List<SourceReader.Content> contents = new ArrayList<>();
        for (String s : given) if (SourceReader.isContent(s)) contents.add(SourceReader.readContent(s));

        String hash = null;
        SchemaCache cache = new SchemaCache(opts.resolvedCacheDir());
        if (cacheable) {
            hash = contentHash(contents, opts);
            if (opts.useCache()) {
                Optional<GraphSchema> hit = cache.read(hash);
                if (hit.isPresent()) return new LoadedOntology(hit.get(), hit.get().issues(), hash, true, given);
            }
        }

        SourceReader.Sink sink = SourceReader.Sink.create();
        int next = 0;
        for (String s : given) {
            if (SourceReader.isContent(s)) {
                SourceReader.Content c = contents.get(next++);
                if (SourceReader.parse(c, sink) == 0) throw empty(c.displayName());
            } else if (SourceReader.isSparql(s)) {
                String url = s.substring(SourceReader.SPARQL_PREFIX.length());
                if (SourceReader.readSparql(url, sink) == 0) throw empty("the SPARQL endpoint " + url);
            } else if (SourceReader.isUrl(s)) {
                if (SourceReader.readUrl(s, sink) == 0) throw empty(s);
            } else {
                if (SourceReader.readTdb2(s, sink) == 0) throw empty(s);
            }
        }
        List<Diagnostic> warnings = new ArrayList<>();
        boolean readExtraFiles = resolveImports(sink, warnings);
        if (readExtraFiles) cacheable = false;
        if (hash == null || readExtraFiles) hash = statementHash(sink, opts);

        GraphSchema schema = new Deriver(sink.graph(), opts.naming(), sink.prefixes()).derive(hash, warnings);
        if (schema.labels().isEmpty() && schema.relTypes().isEmpty() && schema.properties().isEmpty()) {
            throw empty(String.join(", ", given));
        }
        if (cacheable && opts.useCache()) cache.write(hash, schema);
        return new LoadedOntology(schema, schema.issues(), hash, false, given);
    }

    /** Loads the sources with default options. */
    public static LoadedOntology load(List<String> sources) {
        return load(sources, LoadOptions.defaults());
    }

    /**
     * Follows owl:imports: satisfied by an ontology header among the sources, read when it names an existing
     * local file, reported otherwise.
     *
     * @return whether files beyond the given sources were read
     */
    private static boolean resolveImports(SourceReader.Sink sink, List<Diagnostic> warnings) {
        boolean extra = false;
        Set<String> reported = new HashSet<>();
        Set<String> readFiles = new HashSet<>();
        boolean changed = true;
        while (changed) {
            changed = false;
            Set<String> headers = headers(sink);
            List<Triple> imports = sink.graph().find(Node.ANY, Vocab.IMPORTS, Node.ANY).toList();
            for (Triple t : imports) {
                if (!t.getObject().isURI()) continue;
                String target = t.getObject().getURI();
                if (headers.contains(normalize(target)) || reported.contains(target) || readFiles.contains(target)) continue;
                Optional<Path> local = localFile(target);
                if (local.isPresent()) {
                    readFiles.add(target);
                    SourceReader.parse(SourceReader.readContent(local.get().toString()), sink);
                    extra = true;
                    changed = true;
                } else {
                    reported.add(target);
                    String from = t.getSubject().isURI() ? "<" + t.getSubject().getURI() + ">" : "an ontology";
                    warnings.add(Diagnostic.at(Code.IMPORT_NOT_LOADED, Span.NONE, from, "<" + target + ">"));
                }
            }
        }
        return extra;
    }

    private static Set<String> headers(SourceReader.Sink sink) {
        Set<String> out = new HashSet<>();
        sink.graph().find(Node.ANY, Vocab.TYPE, Vocab.ONTOLOGY).forEach(t -> {
            if (t.getSubject().isURI()) {
                out.add(normalize(t.getSubject().getURI()));
                SourceReader.objects(sink.graph(), t.getSubject(), Vocab.VERSION_IRI)
                        .forEach(v -> { if (v.isURI()) out.add(normalize(v.getURI())); });
            }
        });
        return out;
    }

    /** Ontology IRIs are written with and without a trailing '#' or '/'; both name the same ontology. */
    private static String normalize(String iri) {
        return iri.endsWith("#") || iri.endsWith("/") ? iri.substring(0, iri.length() - 1) : iri;
    }

    private static Optional<Path> localFile(String iri) {
        if (!iri.startsWith("file:")) return Optional.empty();
        try {
            Path p = Path.of(java.net.URI.create(iri));
            return Files.isRegularFile(p) ? Optional.of(p) : Optional.empty();
        } catch (RuntimeException e) {
            return Optional.empty();
        }
    }

    private static OntologyException empty(String what) {
        return OntologyException.of(Diagnostic.at(Code.ONTOLOGY_EMPTY, Span.NONE, what));
    }

    private static String contentHash(List<SourceReader.Content> contents, LoadOptions opts) {
        MessageDigest md = sha256();
        md.update(prelude(opts));
        for (SourceReader.Content c : contents) {
            md.update((c.lang().getName() + "\0" + c.bytes().length + "\0").getBytes(StandardCharsets.UTF_8));
            md.update(c.bytes());
        }
        return HexFormat.of().formatHex(md.digest());
    }

    /** For sources that are not files: the statements themselves, sorted so that their order does not matter. */
    private static String statementHash(SourceReader.Sink sink, LoadOptions opts) {
        MessageDigest md = sha256();
        md.update(prelude(opts));
        Set<String> lines = new TreeSet<>();
        sink.graph().find().forEach(t -> lines.add(t.toString()));
        for (String l : lines) md.update((l + "\n").getBytes(StandardCharsets.UTF_8));
        return HexFormat.of().formatHex(md.digest());
    }

    private static byte[] prelude(LoadOptions opts) {
        return ("termgate-schema\0" + SchemaJson.FORMAT + "\0" + Deriver.RULES_VERSION + "\0" + opts.naming() + "\0")
                .getBytes(StandardCharsets.UTF_8);
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this Java runtime", e);
        }
    }
}
