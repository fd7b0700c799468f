package dev.termgate.eval;

import dev.termgate.audit.AuditEntry;
import dev.termgate.audit.AuditReport;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.Checked;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * The HTML reports opened in headless Chromium (Debian package {@code chromium}; {@code .ci/run} installs it): the
 * page renders, every chart is a non-empty SVG with drawn bars, the console shows no error, and a screenshot is
 * taken. Skipped, with the reason, where Chromium is not installed.
 */
class HtmlReportChromiumTest {

    static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    static GraphSchema schema;

    @BeforeAll
    static void load() {
        schema = OntologyLoader.load(List.of()).schema();
    }

    static EvalReport report() {
        List<Checked.TermUse> terms = List.of(new Checked.TermUse("label", "Vessel", "https://example.org/termgate/maritime#Vessel", "direct"),
                new Checked.TermUse("relationship", "OPERATED_BY", "https://example.org/termgate/maritime#operatedBy", "direct"));
        List<EvalResult> rs = new ArrayList<>();
        String[] shapes = {"list", "count", "superlative", "group"};
        for (int i = 0; i < 12; i++) {
            EvalResult.Status st = i % 4 == 3 ? EvalResult.Status.WRONG : i == 10 ? EvalResult.Status.BAD_GOLD : EvalResult.Status.CORRECT;
            rs.add(new EvalResult("q" + i, "question <" + i + "> & \"quoted\"", shapes[i % 4], Optional.of(i < 8 ? "dev" : "holdout"), st,
                    i % 3 != 0, true, true, 1 + i % 3, i % 5 == 0 ? List.of("label") : List.of(), null, null, 3, 5,
                    Optional.of("MATCH (v:Vessel) RETURN v.name"), "MATCH (v:Vessel) RETURN v.name", "", terms));
        }
        return new EvalReport("offline", rs, 60, schema);
    }

    record Rendered(String dom, String log, Path screenshot) {}

    static Rendered open(Path dir, String html) throws IOException, InterruptedException {
        assumeTrue(Files.isExecutable(CHROMIUM), "chromium is not installed at /usr/bin/chromium (apt-get install chromium); test skipped");
        Path page = dir.resolve("report.html");
        Files.writeString(page, html, StandardCharsets.UTF_8);
        Path shot = dir.resolve("report.png");
        String dom = run(dir, List.of("--dump-dom", page.toUri().toString()), dir.resolve("dom.txt"));
        String log = run(dir, List.of("--enable-logging=stderr", "--v=0", "--window-size=1200,1600", "--screenshot=" + shot,
                page.toUri().toString()), dir.resolve("log.txt"));
        return new Rendered(dom, log, shot);
    }

    private static String run(Path dir, List<String> extra, Path output) throws IOException, InterruptedException {
        List<String> cmd = new ArrayList<>(List.of(CHROMIUM.toString(), "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic",
                "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--user-data-dir=" + Files.createTempDirectory(dir, "profile")));
        cmd.addAll(extra);
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(output.toFile()).start();
        if (!p.waitFor(90, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("chromium did not finish within 90 s");
        }
        return Files.readString(output, StandardCharsets.UTF_8);
    }

    static void assertCharts(Rendered r, List<String> ids) throws IOException {
        for (String id : ids) {
            Matcher m = Pattern.compile("<svg id=\"" + id + "\"[^>]*>(.*?)</svg>", Pattern.DOTALL).matcher(r.dom());
            assertTrue(m.find(), "chart " + id + " is in the rendered page");
            Matcher bar = Pattern.compile("class=\"bar\"[^>]*(?:width|height)=\"([0-9.]+)\"").matcher(m.group(1));
            double drawn = 0;
            while (bar.find()) drawn = Math.max(drawn, Double.parseDouble(bar.group(1)));
            assertTrue(drawn > 0, "chart " + id + " draws at least one bar");
        }
        assertFalse(r.log().contains("Uncaught"), r.log());
        assertFalse(Pattern.compile("(?m)^.*:ERROR:CONSOLE").matcher(r.log()).find(), r.log());
        assertFalse(r.log().contains("Failed to load resource"), r.log());
        assertTrue(Files.exists(r.screenshot()) && Files.size(r.screenshot()) > 1000, "a screenshot was taken: " + r.log());
    }

    @Test
    void evalReportRendersItsCharts(@TempDir Path dir) throws Exception {
        Rendered r = open(dir, HtmlReport.eval(report()));
        assertCharts(r, List.of("accuracy-by-shape", "accuracy-by-split", "attempts-histogram", "term-coverage", "repairs-by-kind"));
        assertTrue(r.dom().contains("question &lt;3&gt; &amp; \"quoted\""), "text is escaped");
    }

    @Test
    void auditCoverageViewRenders(@TempDir Path dir) throws Exception {
        List<AuditEntry> es = List.of(new AuditEntry("a1", 1, Optional.of("q"), Optional.of("MATCH (v:Vessel) RETURN v.vesselName"), true,
                Optional.of("m"), Optional.of(List.of("Vessel")), List.of(
                        new Checked.TermUse("label", "Vessel", "https://example.org/termgate/maritime#Vessel", "direct"),
                        new Checked.TermUse("property", "vesselName", "https://example.org/termgate/maritime#vesselName", "direct"))));
        AuditReport a = new AuditReport(es, schema);
        assertEquals(1, a.deprecatedUsed().size());
        Rendered r = open(dir, HtmlReport.audit(a));
        assertCharts(r, List.of("term-coverage", "term-usage"));
    }
}
