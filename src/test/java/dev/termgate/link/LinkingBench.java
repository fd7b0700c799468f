package dev.termgate.link;

import dev.termgate.card.Cards;
import dev.termgate.card.TokenEncoding;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;

/**
 * Speed of schema linking on schema.org (issue 7: one question in at most 50 ms warm, term embeddings cached;
 * report the one-time embedding cost). Skipped by default; run with
 * {@code mvn -B -Pbench verify -Dtest=LinkingBench}. Figures are printed, never asserted: the machine is shared.
 */
@Tag("bench")
class LinkingBench {

    @Test
    void firstTimeEmbeddingOfAllSchemaOrgTerms(@TempDir Path emptyCache) {
        GraphSchema s = LinkingFixtures.schemaOrg();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        StandardLinker l = new StandardLinker(s, LinkingFixtures.options().withCacheDir(emptyCache));
        Embedder.miniLm().embed("load the model first, so only the terms are timed");
        long cpu0 = mx.getCurrentThreadCpuTime();
        TermVectors v = l.vectors("en");
        long cpu = mx.getCurrentThreadCpuTime() - cpu0;
        int terms = s.labels().size() + s.relTypes().size() + s.properties().size();
        System.out.printf(Locale.ROOT, "first-time embedding of %d schema.org terms: %d ms wall (%.1f ms per term); "
                        + "calling thread CPU %d ms (the model also runs on a worker pool)%n",
                terms, v.computeMillis(), (double) v.computeMillis() / terms, cpu / 1_000_000);
    }

    @Test
    void warmLinkingOfOneQuestion() throws Exception {
        GraphSchema s = LinkingFixtures.schemaOrg();
        List<LinkingFixtures.Question> qs = LinkingFixtures.questions(Path.of("src/test/resources/questions/schemaorg.jsonl"));
        SchemaLinker linker = Linkers.warmUp(Linkers.standard(s, LinkingFixtures.options()));
        for (int rep = 0; rep < 3; rep++) for (LinkingFixtures.Question q : qs) linker.link(q.text(), s);
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        List<Double> wall = new ArrayList<>();
        List<Double> cpu = new ArrayList<>();
        List<Double> cardWall = new ArrayList<>();
        for (int rep = 0; rep < 3; rep++) {
            for (LinkingFixtures.Question q : qs) {
                long c0 = mx.getCurrentThreadCpuTime();
                long t0 = System.nanoTime();
                Linking linking = linker.link(q.text(), s);
                long t1 = System.nanoTime();
                cpu.add((mx.getCurrentThreadCpuTime() - c0) / 1e6);
                wall.add((t1 - t0) / 1e6);
                Cards.forQuestion(s, linking, Cards.DEFAULT_BUDGET, TokenEncoding.CL100K_BASE);
                cardWall.add((System.nanoTime() - t0) / 1e6);
            }
        }
        System.out.printf(Locale.ROOT, "schema.org, %d questions x 3, warm, embeddings cached: link median %.1f ms "
                        + "(p90 %.1f) wall, median %.1f ms CPU of the calling thread; link + budgeted card median %.1f ms wall; "
                        + "load average %.1f%n",
                qs.size(), pct(wall, 50), pct(wall, 90), pct(cpu, 50), pct(cardWall, 50),
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
    }

    private static double pct(List<Double> xs, int p) {
        List<Double> s = new ArrayList<>(xs);
        Collections.sort(s);
        return s.get(Math.min(s.size() - 1, (int) Math.ceil(p / 100.0 * s.size()) - 1));
    }
}
