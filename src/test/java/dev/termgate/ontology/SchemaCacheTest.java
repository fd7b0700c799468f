package dev.termgate.ontology;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.Names;
import dev.termgate.schema.SchemaJson;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SchemaCacheTest {

    static final List<String> SCHEMA_ORG = List.of(OntologyLoaderTest.DIR + "schema.nq");

    @TempDir
    Path dir;

    static void assertSameSchema(GraphSchema a, GraphSchema b) {
        SourcesTest.assertSameSchema(a, b);
        assertEquals(a.sourceHash(), b.sourceHash());
        assertEquals(SchemaJson.toJson(a), SchemaJson.toJson(b));
    }

    @Test
    void secondLoadComesFromTheCacheAndEqualsTheDerivedSchema() {
        LoadOptions opts = LoadOptions.defaults().withCacheDir(dir);
        LoadedOntology first = OntologyLoader.load(SCHEMA_ORG, opts);
        assertFalse(first.fromCache());
        LoadedOntology second = OntologyLoader.load(SCHEMA_ORG, opts);
        assertTrue(second.fromCache());
        assertEquals(first.contentHash(), second.contentHash());
        assertSameSchema(first.schema(), second.schema());
        // Closures are recomputed from the cached direct links: spot-check one the reasoner test covers fully.
        assertEquals(first.schema().superLabels("Hospital"), second.schema().superLabels("Hospital"));
    }

    @Test
    void corruptedCacheFileIsIgnoredAndRewritten() throws IOException {
        LoadOptions opts = LoadOptions.defaults().withCacheDir(dir);
        LoadedOntology first = OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts);
        Path file = new SchemaCache(dir).fileFor(first.contentHash());
        Files.writeString(file, "{\"format\": 1, \"labels\": [ truncated");
        LoadedOntology again = OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts);
        assertFalse(again.fromCache());
        assertSameSchema(first.schema(), again.schema());
        assertSameSchema(first.schema(), SchemaJson.fromJson(Files.readString(file)));
    }

    @Test
    void unwritableCacheDirectoryIsSkipped() throws IOException {
        Path notADir = Files.writeString(dir.resolve("plain-file"), "x");
        LoadOptions opts = LoadOptions.defaults().withCacheDir(notADir.resolve("sub"));
        assertFalse(OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts).fromCache());
        assertFalse(OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts).fromCache());
    }

    @Test
    void keyCoversNamingAndNoCacheOptionBypassesIt() {
        LoadOptions opts = LoadOptions.defaults().withCacheDir(dir);
        String graph = OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts).contentHash();
        String asIs = OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts.withNaming(Names.Style.AS_IS)).contentHash();
        assertNotEquals(graph, asIs);
        assertFalse(OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts.withCache(false)).fromCache());
        assertTrue(OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), opts).fromCache());
    }

    @Test
    void jsonRoundTripOfEveryPublicOntology() {
        for (String name : List.of("schema", "org", "prov", "foaf", "dcat")) {
            GraphSchema s = OntologyLoader.load(List.of(OntologyLoaderTest.DIR + name + ".nq"),
                    LoadOptions.defaults().withCache(false)).schema();
            assertSameSchema(s, SchemaJson.fromJson(SchemaJson.toJson(s)));
            assertSameSchema(s, SchemaJson.fromJson(SchemaJson.toCompactJson(s)));
        }
    }
}
