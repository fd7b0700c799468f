package dev.termgate.link;

import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;

/**
 * Lexical-only and embedding-only ablations on schema.org beside the combined figure, with the same budgeted card
 * as {@link SchemaLinkingQualityTest}. Run with {@code mvn -B -Pbench verify -Dtest=LinkingAblationReport}.
 */
@Tag("bench")
class LinkingAblationReport {

    @Test
    void schemaOrgAblations() throws IOException {
        GraphSchema s = LinkingFixtures.schemaOrg();
        List<LinkingFixtures.Question> qs = LinkingFixtures.questions(Path.of("src/test/resources/questions/schemaorg.jsonl"));
        LinkOptions o = LinkingFixtures.options();
        SchemaLinkingQualityTest.Result combined = SchemaLinkingQualityTest.evaluate(s, qs, o);
        SchemaLinkingQualityTest.Result lexical = SchemaLinkingQualityTest.evaluate(s, qs, o.lexicalOnly());
        SchemaLinkingQualityTest.Result semantic = SchemaLinkingQualityTest.evaluate(s, qs, o.semanticOnly());
        System.out.println(SchemaLinkingQualityTest.report("schema.org", qs.size(), combined, lexical, semantic));
        lexical.misses.forEach(m -> System.out.println("  lexical only missed " + m));
        semantic.misses.forEach(m -> System.out.println("  embeddings only missed " + m));
    }
}
