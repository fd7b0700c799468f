package dev.termgate.bench;

import dev.termgate.card.Card;
import dev.termgate.card.Cards;
import dev.termgate.card.TokenEncoding;
import dev.termgate.link.LinkedTerm;
import dev.termgate.link.Linking;
import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.Random;

/**
 * Warm time of the budgeted card alone (linking excluded) on schema.org (src/test/resources/ontologies, see
 * NOTICE.md), for a ranking of 300 terms (the linker's default cap) drawn at random. Run with
 * {@code mvn -B -Pbench verify -Dtest=CardBench}.
 */
@Tag("bench")
class CardBench {

    @Test
    void budgetedCardOnSchemaOrg() throws Exception {
        Path cache = Files.createTempDirectory("termgate-bench");
        GraphSchema schema = OntologyLoader.load(List.of("src/test/resources/ontologies/schema.nq"),
                LoadOptions.defaults().withCacheDir(cache)).schema();
        List<LinkedTerm> all = new ArrayList<>();
        for (TermKind k : TermKind.values()) {
            for (TermInfo t : schema.terms(k)) all.add(new LinkedTerm(k, t.name(), 0.5, List.of()));
        }
        Random random = new Random(1);
        List<Linking> linkings = new ArrayList<>();
        for (int i = 0; i < 20; i++) {
            Collections.shuffle(all, random);
            linkings.add(new Linking(all.subList(0, 300), false, List.of()));
        }
        for (int round = 0; round < 3; round++) {
            for (Linking l : linkings) Cards.forQuestion(schema, l, Cards.DEFAULT_BUDGET, TokenEncoding.CL100K_BASE);
        }
        long[] ms = new long[linkings.size()];
        int tokens = 0;
        for (int i = 0; i < linkings.size(); i++) {
            long t0 = System.nanoTime();
            Card c = Cards.forQuestion(schema, linkings.get(i), Cards.DEFAULT_BUDGET, TokenEncoding.CL100K_BASE);
            ms[i] = (System.nanoTime() - t0) / 1_000_000;
            tokens += c.tokens();
        }
        Arrays.sort(ms);
        int wholeTokens = Cards.whole(schema, TokenEncoding.CL100K_BASE).tokens();
        System.out.printf("budgeted card (300 ranked terms, budget %d) on schema.org: median %d ms, max %d ms warm;"
                        + " mean card %d tokens; whole card %d tokens%n",
                Cards.DEFAULT_BUDGET, ms[ms.length / 2], ms[ms.length - 1], tokens / ms.length, wholeTokens);
    }
}
