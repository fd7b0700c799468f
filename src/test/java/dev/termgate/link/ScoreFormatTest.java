package dev.termgate.link;

import org.junit.jupiter.api.Test;

import java.util.Locale;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** The evidence's score text is what {@code String.format("%.2f")} (the JDK, the reference) prints. */
class ScoreFormatTest {
    @Test
    void twoDecimalsLikeTheJdk() {
        Random r = new Random(7);
        for (int i = 0; i < 100_000; i++) {
            double d = r.nextDouble() * 3 - 1;
            assertEquals(String.format(Locale.ROOT, "%.2f", d), StandardLinker.fmt(d), "for " + d);
        }
        for (double d : new double[] {0, 1, -0.001, 0.999, 0.5, 12.3456}) {
            assertEquals(String.format(Locale.ROOT, "%.2f", d), StandardLinker.fmt(d), "for " + d);
        }
    }
}
