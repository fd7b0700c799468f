package dev.termgate.link;

import dev.termgate.card.Card;
import dev.termgate.card.Cards;
import dev.termgate.card.TokenCounter;
import dev.termgate.card.TokenEncoding;
import dev.termgate.schema.GraphSchema;
import org.apache.jena.query.Dataset;
import org.apache.jena.riot.Lang;
import org.apache.jena.riot.RDFDataMgr;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Gold-term recall of the question card (issue 7) on the project's own question sets: schema.org
 * (src/test/resources/questions/schemaorg.jsonl) and the maritime demo (examples/maritime/questions.jsonl).
 * A gold term counts as found when the budgeted card made by {@link Cards#forQuestion} shows it. Lexical-only
 * and embedding-only ablations are printed beside the combined figure for the demo here, and for schema.org by
 * {@link LinkingAblationReport} (tagged "bench": a schema.org card takes long enough to build that three passes
 * over the set would triple this test's time on a shared machine).
 */
class SchemaLinkingQualityTest {

    static final int BUDGET = Cards.DEFAULT_BUDGET;

    private static GraphSchema schemaOrg;
    private static GraphSchema demo;

    @BeforeAll
    static void load() {
        schemaOrg = LinkingFixtures.schemaOrg();
        demo = LinkingFixtures.demo();
    }

    /** Every gold name must be a term of the derived schema, or the question set is wrong, not the linker. */
    @Test
    void goldTermsExistInTheDerivedSchemas() throws IOException {
        checkGold(schemaOrg, LinkingFixtures.questions(Path.of("src/test/resources/questions/schemaorg.jsonl")));
        checkGold(demo, LinkingFixtures.questions(Path.of("examples/maritime/questions.jsonl")));
    }

    private static void checkGold(GraphSchema s, List<LinkingFixtures.Question> qs) {
        List<String> missing = new ArrayList<>();
        for (LinkingFixtures.Question q : qs) {
            for (String t : q.terms()) {
                if (!s.labels().containsKey(t) && !s.relTypes().containsKey(t) && !s.properties().containsKey(t)) {
                    missing.add(q.id() + ":" + t);
                }
            }
        }
        assertEquals(List.of(), missing, "gold names not in the schema derived from the ontology");
    }

    @Test
    void schemaOrgRecallAtDefaultBudget() throws IOException {
        List<LinkingFixtures.Question> qs = LinkingFixtures.questions(Path.of("src/test/resources/questions/schemaorg.jsonl"));
        assertTrue(qs.size() >= 40, "at least 40 questions (issue 7)");
        Result combined = evaluate(schemaOrg, qs, LinkingFixtures.options());

        // Reference size: the whole ontology as Turtle written by Jena, counted with jtokkit cl100k_base.
        Dataset ds = RDFDataMgr.loadDataset(LinkingFixtures.SCHEMA_ORG.toString());
        StringWriter turtle = new StringWriter();
        RDFDataMgr.write(turtle, ds.getUnionModel(), Lang.TURTLE);
        int turtleTokens = TokenCounter.of(TokenEncoding.CL100K_BASE).count(turtle.toString());
        double ratioLargest = (double) turtleTokens / combined.maxTokens;
        double ratioMean = turtleTokens / combined.meanTokens();

        System.out.printf(Locale.ROOT, "schema.org (%d questions, budget %d): gold-term recall %.1f%% (%d/%d); "
                        + "ablations: mvn -B -Pbench verify -Dtest=LinkingAblationReport%n",
                qs.size(), BUDGET, 100 * combined.recall(), combined.found, combined.gold);
        System.out.printf(Locale.ROOT, "schema.org as Turtle: %d tokens (cl100k_base); largest card %d tokens "
                        + "(%.0fx smaller), mean card %.0f tokens (%.0fx smaller)%n",
                turtleTokens, combined.maxTokens, ratioLargest, combined.meanTokens(), ratioMean);
        combined.misses.forEach(m -> System.out.println("  missed " + m));

        assertTrue(combined.recall() >= 0.95, "schema.org gold-term recall at 1,500 tokens >= 95% (issue 7): " + combined.recall());
        assertTrue(ratioLargest >= 300, "every card at least 300x smaller than the Turtle ontology (issue 7): " + ratioLargest);
    }

    @Test
    void demoRecallAtDefaultBudget() throws IOException {
        List<LinkingFixtures.Question> qs = LinkingFixtures.questions(Path.of("examples/maritime/questions.jsonl"));
        LinkOptions o = LinkingFixtures.options().withValues(LinkingFixtures.demoValues(demo));
        Result combined = evaluate(demo, qs, o);
        Result lexical = evaluate(demo, qs, o.lexicalOnly());
        Result semantic = evaluate(demo, qs, o.semanticOnly());
        System.out.println(report("maritime demo", qs.size(), combined, lexical, semantic));
        System.out.printf(Locale.ROOT, "maritime demo: whole card %d tokens, mean question card %.0f tokens%n",
                Cards.whole(demo, TokenEncoding.CL100K_BASE).tokens(), combined.meanTokens());
        combined.misses.forEach(m -> System.out.println("  missed " + m));
        assertEquals(1.0, combined.recall(), "demo gold-term recall at 1,500 tokens must be 100% (issue 7)");
    }

    /** Recall and card sizes of one linker configuration over a question set. */
    static final class Result {
        int gold;
        int found;
        int maxTokens;
        long sumTokens;
        int cards;
        final List<String> misses = new ArrayList<>();

        double recall() {
            return gold == 0 ? 0 : (double) found / gold;
        }

        double meanTokens() {
            return cards == 0 ? 0 : (double) sumTokens / cards;
        }
    }

    static Result evaluate(GraphSchema schema, List<LinkingFixtures.Question> qs, LinkOptions options) {
        SchemaLinker linker = Linkers.standard(schema, options);
        Result r = new Result();
        for (LinkingFixtures.Question q : qs) {
            Linking linking = linker.link(q.text(), schema);
            Card card = Cards.forQuestion(schema, linking, BUDGET, TokenEncoding.CL100K_BASE);
            r.cards++;
            r.sumTokens += card.tokens();
            r.maxTokens = Math.max(r.maxTokens, card.tokens());
            List<String> missed = new ArrayList<>();
            for (String t : q.terms()) {
                r.gold++;
                boolean shown = card.scope().labels().contains(t) || card.scope().relTypes().contains(t)
                        || card.scope().keys().contains(t);
                if (shown) r.found++;
                else missed.add(t);
            }
            if (!missed.isEmpty()) r.misses.add(q.id() + " " + missed + " — " + q.text());
        }
        return r;
    }

    static String report(String set, int n, Result combined, Result lexical, Result semantic) {
        return String.format(Locale.ROOT,
                "%s (%d questions, budget %d): gold-term recall combined %.1f%% (%d/%d), lexical only %.1f%%, "
                        + "embeddings only %.1f%%",
                set, n, BUDGET, 100 * combined.recall(), combined.found, combined.gold, 100 * lexical.recall(),
                100 * semantic.recall());
    }
}
