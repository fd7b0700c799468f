package dev.termgate.bench;

import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.LoadedOntology;
import dev.termgate.ontology.OntologyLoader;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.function.Supplier;

/**
 * Schema.org (src/test/resources/ontologies/schema.nq, 17,823 statements) → graph schema, warm: derived from the
 * file and read from the on-disk cache. Targets (issue 2): at most 400 ms and 50 ms. Prints medians of wall and
 * thread CPU time; CPU time shows the cost when the machine is shared. Run:
 * {@code mvn -B -o -Pbench test -Dtest=OntologyBench}
 */
@Tag("bench")
class OntologyBench {

    static final List<String> SCHEMA_ORG = List.of("src/test/resources/ontologies/schema.nq");
    static final int WARMUP = 8;
    static final int RUNS = 20;

    @TempDir
    Path cache;

    @Test
    void schemaOrgDerivedAndFromCache() {
        LoadOptions derive = LoadOptions.defaults().withCache(false);
        LoadOptions cached = LoadOptions.defaults().withCacheDir(cache);
        report("derive from file", measure(() -> OntologyLoader.load(SCHEMA_ORG, derive), false), 400);
        OntologyLoader.load(SCHEMA_ORG, cached);
        report("read from cache ", measure(() -> OntologyLoader.load(SCHEMA_ORG, cached), true), 50);
    }

    private static long[][] measure(Supplier<LoadedOntology> load, boolean expectCache) {
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        for (int i = 0; i < WARMUP; i++) check(load.get(), expectCache);
        long[] wall = new long[RUNS];
        long[] cpu = new long[RUNS];
        for (int i = 0; i < RUNS; i++) {
            long c0 = mx.getCurrentThreadCpuTime();
            long t0 = System.nanoTime();
            LoadedOntology lo = load.get();
            wall[i] = System.nanoTime() - t0;
            cpu[i] = mx.getCurrentThreadCpuTime() - c0;
            check(lo, expectCache);
        }
        return new long[][] {wall, cpu};
    }

    private static void check(LoadedOntology lo, boolean expectCache) {
        if (lo.fromCache() != expectCache || lo.schema().labels().size() < 1000) throw new IllegalStateException("unexpected load result");
    }

    private static void report(String what, long[][] t, int targetMs) {
        System.out.printf("OntologyBench %s: median %.1f ms wall (p90 %.1f), %.1f ms CPU; target <= %d ms; load average %.1f on %d cores%n",
                what, median(t[0]), p90(t[0]), median(t[1]), targetMs,
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage(), Runtime.getRuntime().availableProcessors());
    }

    private static double median(long[] ns) {
        long[] s = ns.clone();
        Arrays.sort(s);
        return s[s.length / 2] / 1e6;
    }

    private static double p90(long[] ns) {
        long[] s = ns.clone();
        Arrays.sort(s);
        return s[(int) Math.ceil(s.length * 0.9) - 1] / 1e6;
    }
}
