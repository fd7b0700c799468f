package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Span;
import org.apache.jena.atlas.web.HttpException;
import org.apache.jena.graph.Graph;
import org.apache.jena.graph.Node;
import org.apache.jena.graph.Triple;
import org.apache.jena.query.Dataset;
import org.apache.jena.query.QueryParseException;
import org.apache.jena.riot.Lang;
import org.apache.jena.riot.RDFLanguages;
import org.apache.jena.riot.RDFParser;
import org.apache.jena.riot.RiotException;
import org.apache.jena.riot.system.ErrorHandler;
import org.apache.jena.riot.system.StreamRDFBase;
import org.apache.jena.sparql.core.DatasetGraph;
import org.apache.jena.sparql.core.Quad;
import org.apache.jena.sparql.exec.QueryExec;
import org.apache.jena.sparql.exec.http.QueryExecHTTPBuilder;
import org.apache.jena.sparql.graph.GraphFactory;
import org.apache.jena.system.Txn;
import org.apache.jena.tdb2.TDB2Factory;
import org.apache.jena.tdb2.sys.TDBInternal;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * Reads RDF sources into one graph: files, URLs, classpath resources, TDB2 directories and SPARQL endpoints.
 * Every failure becomes an {@link OntologyException} with a diagnostic naming the source (and line and column
 * for syntax errors); Jena's exceptions never leave this class.
 */
final class SourceReader {

    static final String SPARQL_PREFIX = "sparql:";
    static final String CLASSPATH_PREFIX = "classpath:";

    /** Where the statements are collected, with the prefixes the sources declared (namespace → prefix). */
    record Sink(Graph graph, Map<String, String> prefixes) {
        static Sink create() {
            return new Sink(GraphFactory.createDefaultGraph(), new TreeMap<>());
        }
    }

    /** The raw content of a file or resource source, read once so that it can be both hashed and parsed. */
    record Content(String source, String displayName, String baseIri, byte[] bytes, Lang lang) {}

    private SourceReader() {}

    static boolean isSparql(String source) {
        return source.startsWith(SPARQL_PREFIX);
    }

    static boolean isUrl(String source) {
        String s = source.toLowerCase(Locale.ROOT);
        return s.startsWith("http://") || s.startsWith("https://");
    }

    static boolean isClasspath(String source) {
        return source.startsWith(CLASSPATH_PREFIX);
    }

    /** Whether the source is read as bytes (a file or classpath resource) and can therefore be hashed. */
    static boolean isContent(String source) {
        if (isSparql(source) || isUrl(source)) return false;
        if (isClasspath(source)) return true;
        return !Files.isDirectory(pathOf(source));
    }

    static Content readContent(String source) {
        if (isClasspath(source)) {
            String res = source.substring(CLASSPATH_PREFIX.length());
            try (InputStream in = SourceReader.class.getClassLoader().getResourceAsStream(res)) {
                if (in == null) throw unreadable(source, "no such resource on the class path");
                return new Content(source, res, "file:///" + res, in.readAllBytes(), langOf(source, res));
            } catch (IOException e) {
                throw unreadable(source, e.getMessage());
            }
        }
        Path p = pathOf(source);
        if (!Files.exists(p)) throw unreadable(source, "no such file");
        if (!Files.isReadable(p)) throw unreadable(source, "permission denied");
        try {
            return new Content(source, source, p.toAbsolutePath().toUri().toString(), Files.readAllBytes(p),
                    langOf(source, p.getFileName().toString()));
        } catch (IOException e) {
            throw unreadable(source, e.getMessage());
        }
    }

    /** Parses file or resource content into the sink; returns the number of statements read. */
    static long parse(Content c, Sink sink) {
        Collector out = new Collector(sink);
        PositionedErrors errors = new PositionedErrors();
        try {
            RDFParser.source(new ByteArrayInputStream(c.bytes())).lang(c.lang()).base(c.baseIri()).checking(false)
                    .errorHandler(errors).parse(out);
        } catch (RiotException e) {
            throw syntax(c.displayName(), errors, e);
        } catch (RuntimeException e) {
            // JSON-LD and RDF/XML parsers may throw their own exceptions for malformed input.
            throw syntax(c.displayName(), errors, e);
        }
        if (errors.first != null) throw syntax(c.displayName(), errors, null);
        return out.count;
    }

    /** Reads an RDF document from the web; the syntax comes from the reply's content type. */
    static long readUrl(String url, Sink sink) {
        Collector out = new Collector(sink);
        PositionedErrors errors = new PositionedErrors();
        try {
            RDFParser.source(url).errorHandler(errors).parse(out);
        } catch (HttpException e) {
            throw OntologyException.service(diag(Code.ONTOLOGY_UNREADABLE, url, "the server answered: " + e.getMessage()));
        } catch (RiotException e) {
            if (errors.first == null && e.getCause() instanceof IOException io) {
                throw OntologyException.service(diag(Code.ONTOLOGY_UNREADABLE, url, io.toString()));
            }
            throw syntax(url, errors, e);
        } catch (RuntimeException e) {
            if (errors.first == null) throw OntologyException.service(diag(Code.ONTOLOGY_UNREADABLE, url, String.valueOf(e.getMessage())));
            throw syntax(url, errors, e);
        }
        return out.count;
    }

    /** Copies every statement of a TDB2 database (all graphs merged), reading only. */
    static long readTdb2(String dir, Sink sink) {
        Path p = pathOf(dir);
        if (!looksLikeTdb2(p)) {
            throw OntologyException.of(diag(Code.ONTOLOGY_UNREADABLE, dir,
                    "it is a directory but not a TDB2 database (no Data-NNNN folder)"));
        }
        Dataset ds;
        try {
            ds = TDB2Factory.connectDataset(p.toString());
        } catch (RuntimeException e) {
            throw OntologyException.of(diag(Code.ONTOLOGY_UNREADABLE, dir, "cannot open the TDB2 database: " + e.getMessage()));
        }
        try {
            DatasetGraph dsg = ds.asDatasetGraph();
            long[] n = {0};
            Txn.executeRead(dsg, () -> {
                Iterator<Quad> it = dsg.find();
                while (it.hasNext()) {
                    sink.graph().add(it.next().asTriple());
                    n[0]++;
                }
                dsg.prefixes().forEach((prefix, ns) -> sink.prefixes().putIfAbsent(ns, prefix));
            });
            return n[0];
        } finally {
            // Release the database so the directory is not held open (tests delete it; other tools may open it).
            TDBInternal.expel(ds.asDatasetGraph());
        }
    }

    /**
     * Fetches the schema part of a store through SPARQL CONSTRUCT queries: class and property declarations,
     * axioms, annotations and the RDF lists that unions are made of. Instance data is not fetched.
     */
    static long readSparql(String endpoint, Sink sink) {
        long n = 0;
        for (String q : SparqlSchemaQueries.ALL) {
            Graph g;
            try {
                g = QueryExecHTTPBuilder.service(endpoint).query(q).timeout(60, java.util.concurrent.TimeUnit.SECONDS)
                        .build().construct();
            } catch (QueryParseException e) {
                throw new IllegalStateException("bad built-in schema query", e);
            } catch (RuntimeException e) {
                throw OntologyException.service(diag(Code.ONTOLOGY_UNREADABLE, "the SPARQL endpoint " + endpoint,
                        describe(e)));
            }
            Iterator<Triple> it = g.find();
            while (it.hasNext()) {
                sink.graph().add(it.next());
                n++;
            }
        }
        return n;
    }

    static boolean looksLikeTdb2(Path dir) {
        try (var s = Files.list(dir)) {
            return s.anyMatch(f -> f.getFileName().toString().startsWith("Data-") && Files.isDirectory(f));
        } catch (IOException e) {
            return false;
        }
    }

    static Path pathOf(String source) {
        try {
            if (source.startsWith("file:")) return Path.of(URI.create(source));
            return Path.of(source);
        } catch (IllegalArgumentException e) {
            throw unreadable(source, "not a valid path");
        }
    }

    private static Lang langOf(String source, String fileName) {
        Lang lang = RDFLanguages.filenameToLang(fileName);
        if (lang == null && fileName.toLowerCase(Locale.ROOT).endsWith(".owl")) lang = Lang.RDFXML;
        if (lang == null) {
            throw unreadable(source, "unknown RDF syntax; name the file .ttl, .rdf, .owl, .nt, .nq, .jsonld or .trig");
        }
        return lang;
    }

    private static String describe(RuntimeException e) {
        Throwable root = e;
        while (root.getCause() != null && root.getCause() != root) root = root.getCause();
        String m = root.getMessage();
        if (root instanceof java.net.ConnectException) return "connection refused";
        return m == null || m.isBlank() ? root.getClass().getSimpleName() : m;
    }

    static OntologyException unreadable(String source, String why) {
        return OntologyException.of(diag(Code.ONTOLOGY_UNREADABLE, source, why));
    }

    private static OntologyException syntax(String name, PositionedErrors errors, RuntimeException e) {
        String msg;
        long line = -1;
        long col = -1;
        if (errors.first != null) {
            msg = errors.first;
            line = errors.line;
            col = errors.col;
        } else {
            msg = e == null ? "syntax error" : String.valueOf(e.getMessage());
        }
        StringBuilder sb = new StringBuilder(name);
        if (line > 0) sb.append(", line ").append(line);
        if (col > 0) sb.append(", column ").append(col);
        sb.append(": ").append(msg.strip());
        return OntologyException.of(Diagnostic.at(Code.ONTOLOGY_SYNTAX, Span.NONE, sb.toString()));
    }

    static Diagnostic diag(Code code, Object... args) {
        return Diagnostic.at(code, Span.NONE, args);
    }

    /** Remembers the first error with its position; warnings are ignored (Jena logs nothing through this). */
    private static final class PositionedErrors implements ErrorHandler {
        String first;
        long line;
        long col;

        @Override
        public void warning(String message, long line, long col) {
            // Parser warnings (e.g. a bad language tag) do not stop loading.
        }

        @Override
        public void error(String message, long line, long col) {
            record(message, line, col);
            throw new RiotException(message);
        }

        @Override
        public void fatal(String message, long line, long col) {
            record(message, line, col);
            throw new RiotException(message);
        }

        private void record(String message, long line, long col) {
            if (first == null) {
                first = message;
                this.line = line;
                this.col = col;
            }
        }
    }

    /** Merges quads into the one graph: the ontology is the union of every graph of every source. */
    private static final class Collector extends StreamRDFBase {
        private final Sink sink;
        long count;

        Collector(Sink sink) {
            this.sink = sink;
        }

        @Override
        public void triple(Triple triple) {
            sink.graph().add(triple);
            count++;
        }

        @Override
        public void quad(Quad quad) {
            sink.graph().add(quad.asTriple());
            count++;
        }

        @Override
        public void prefix(String prefix, String iri) {
            if (!prefix.isEmpty()) sink.prefixes().putIfAbsent(iri, prefix);
        }
    }

    static List<Node> objects(Graph g, Node s, Node p) {
        return g.find(s, p, Node.ANY).mapWith(Triple::getObject).toList();
    }
}
