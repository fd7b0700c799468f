package dev.termgate.ontology;

import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class OntologyLoaderTest {

    static final String DIR = "src/test/resources/ontologies/";

    @TempDir
    Path cache;

    /** The five public ontologies (NOTICE.md in the same folder) load without an error diagnostic. */
    @ParameterizedTest
    @ValueSource(strings = {"schema", "org", "prov", "foaf", "dcat"})
    void publicOntologiesLoad(String name) {
        LoadedOntology lo = OntologyLoader.load(List.of(DIR + name + ".nq"), LoadOptions.defaults().withCacheDir(cache));
        GraphSchema s = lo.schema();
        assertFalse(s.labels().isEmpty());
        assertFalse(s.relTypes().isEmpty());
        assertTrue(lo.problems().stream().noneMatch(Diagnostic::isError), () -> lo.problems().toString());
    }

    @Test
    void demoOntologyLoadsFromTheClassPath() {
        LoadedOntology lo = OntologyLoader.load(List.of(), LoadOptions.defaults().withCacheDir(cache));
        assertTrue(lo.schema().labels().size() >= 25, "the demo ontology has 25-40 classes (issue 2)");
        assertTrue(lo.problems().stream().noneMatch(Diagnostic::isError), () -> lo.problems().toString());
    }
}
