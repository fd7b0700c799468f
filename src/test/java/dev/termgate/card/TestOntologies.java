package dev.termgate.card;

import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

/**
 * The demo ontology (our own) and the public ontologies copied into src/test/resources/ontologies (sources and
 * licences in NOTICE.md there), each loaded once per test run, with the schema cache in a temporary directory.
 */
final class TestOntologies {

    static final Path DIR = Path.of("src", "test", "resources", "ontologies");
    private static final Map<String, GraphSchema> LOADED = new ConcurrentHashMap<>();
    private static LoadOptions options;

    private TestOntologies() {}

    /** The schema of a file under {@link #DIR}; the empty name gives the demo ontology. */
    static synchronized GraphSchema schema(String file) {
        if (options == null) {
            try {
                Path cache = Files.createTempDirectory("termgate-card-test");
                cache.toFile().deleteOnExit();
                options = LoadOptions.defaults().withCache(false).withCacheDir(cache);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return LOADED.computeIfAbsent(file, f -> OntologyLoader.load(
                f.isEmpty() ? List.of() : List.of(DIR.resolve(f).toString()), options).schema());
    }
}
