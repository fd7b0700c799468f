package dev.termgate.eval;

import dev.termgate.audit.AuditReport;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * A self-contained HTML page: styles inline, charts drawn as inline SVG, no script, font or anything fetched
 * from elsewhere, so it can be mailed or archived and opened offline.
 */
public final class HtmlReport {

    private HtmlReport() {}

    /** One bar: a label, a value and the value written beside it. */
    record Bar(String label, double value, String text) {}

    public static String eval(EvalReport r) {
        StringBuilder b = new StringBuilder();
        head(b, "termgate evaluation: " + r.model());
        b.append("<h1>Evaluation of ").append(esc(r.model())).append("</h1>\n");
        b.append("<p class=\"lead\">").append(r.questions()).append(" question(s)");
        if (r.badGold() > 0) b.append(", ").append(r.badGold()).append(" with a bad gold query (not counted)");
        b.append(String.format(Locale.ROOT, "; total %.1f s.</p>%n", r.elapsedMillis() / 1000.0));
        b.append("<table class=\"figures\">\n");
        figure(b, "Execution accuracy", pct(r.accuracy()) + " (" + r.correct() + " of " + r.counted() + ")");
        figure(b, "Valid as written", pct(r.shareValidAsWritten()));
        figure(b, "Valid after repair", pct(r.shareValidAfterRepair()));
        figure(b, "Valid after re-ask", pct(r.shareValidFinal()));
        figure(b, "Re-asked", String.valueOf(r.reasked()));
        figure(b, "Time per question", String.format(Locale.ROOT, "mean %.0f ms, median %d ms, max %d ms", r.meanMillis(), r.medianMillis(), r.maxMillis()));
        figure(b, "Tokens", (r.promptTokens() == null ? "-" : r.promptTokens()) + " prompt, "
                + (r.completionTokens() == null ? "-" : r.completionTokens()) + " completion");
        b.append("</table>\n");

        b.append("<section><h2>Accuracy by question shape</h2>\n");
        List<Bar> shapes = new ArrayList<>();
        r.byShape().forEach((k, v) -> shapes.add(new Bar(k, v.rate(), pct(v.rate()) + "  " + v.correct() + "/" + v.counted())));
        b.append(hbars("accuracy-by-shape", shapes, 1.0));
        if (r.bySplit().size() > 1 || !r.bySplit().containsKey("all")) {
            b.append("<h3>By split</h3>\n");
            List<Bar> splits = new ArrayList<>();
            r.bySplit().forEach((k, v) -> splits.add(new Bar(k, v.rate(), pct(v.rate()) + "  " + v.correct() + "/" + v.counted())));
            b.append(hbars("accuracy-by-split", splits, 1.0));
        }
        b.append("</section>\n");

        b.append("<section><h2>Attempts per question</h2>\n");
        Map<String, Integer> hist = new LinkedHashMap<>();
        r.attemptsHistogram().forEach((k, v) -> hist.put(k + (k == 1 ? " attempt" : " attempts"), v));
        b.append(vbars("attempts-histogram", hist));
        if (!r.repairsByKind().isEmpty()) {
            b.append("<h3>Repairs by kind</h3>\n");
            List<Bar> rep = new ArrayList<>();
            int max = r.repairsByKind().values().stream().mapToInt(Integer::intValue).max().orElse(1);
            r.repairsByKind().forEach((k, v) -> rep.add(new Bar(k, v, String.valueOf(v))));
            b.append(hbars("repairs-by-kind", rep, max));
        }
        b.append("</section>\n");

        b.append("<section><h2>Term coverage</h2>\n<p>Ontology terms used by the valid queries.</p>\n");
        List<Bar> cov = new ArrayList<>();
        for (EvalReport.Coverage c : r.coverage()) {
            double share = c.all().isEmpty() ? 0 : (double) c.used().size() / c.all().size();
            cov.add(new Bar(c.kind() + "s", share, c.used().size() + " of " + c.all().size()));
        }
        b.append(hbars("term-coverage", cov, 1.0));
        for (EvalReport.Coverage c : r.coverage()) {
            if (c.unused().isEmpty()) continue;
            b.append("<p class=\"unused\"><b>").append(esc(c.kind())).append("s never used:</b> ")
                    .append(esc(String.join(", ", c.unused()))).append("</p>\n");
        }
        b.append("</section>\n");

        b.append("<section><h2>Questions</h2>\n<table class=\"results\"><thead><tr><th>id</th><th>shape</th><th>outcome</th>"
                + "<th>attempts</th><th>ms</th><th>question</th><th>query</th><th>detail</th></tr></thead><tbody>\n");
        for (EvalResult x : r.results()) {
            b.append("<tr class=\"").append(x.status().word()).append("\"><td>").append(esc(x.id())).append("</td><td>")
                    .append(esc(x.shape())).append("</td><td>").append(esc(x.status().word().replace('_', ' '))).append("</td><td>")
                    .append(x.attempts()).append("</td><td>").append(x.totalMillis()).append("</td><td>").append(esc(x.question()))
                    .append("</td><td><code>").append(esc(x.query().orElse(""))).append("</code></td><td>").append(esc(x.detail()))
                    .append("</td></tr>\n");
        }
        b.append("</tbody></table></section>\n");
        tail(b);
        return b.toString();
    }

    /** The audit's coverage view. */
    public static String audit(AuditReport a) {
        StringBuilder b = new StringBuilder();
        head(b, "termgate term audit");
        b.append("<h1>Term audit</h1>\n<p class=\"lead\">").append(a.entries().size()).append(" quer")
                .append(a.entries().size() == 1 ? "y" : "ies").append(", ")
                .append(a.entries().stream().filter(e -> e.valid()).count()).append(" valid.</p>\n");
        b.append("<section><h2>Term coverage</h2>\n");
        List<Bar> cov = new ArrayList<>();
        for (String kind : a.unused().keySet()) {
            int total = a.total(kind);
            double share = total == 0 ? 0 : (double) a.used(kind) / total;
            cov.add(new Bar(kind + "s", share, a.used(kind) + " of " + total));
        }
        b.append(hbars("term-coverage", cov, 1.0));
        b.append("</section>\n<section><h2>Most used terms</h2>\n");
        List<Bar> top = new ArrayList<>();
        int max = a.usage().stream().mapToInt(AuditReport.Usage::count).max().orElse(1);
        for (AuditReport.Usage u : a.usage().subList(0, Math.min(25, a.usage().size()))) {
            top.add(new Bar(u.kind().charAt(0) + ": " + u.name(), u.count(), String.valueOf(u.count())));
        }
        b.append(top.isEmpty() ? "<p>No term was used.</p>\n" : hbars("term-usage", top, max));
        b.append("</section>\n<section><h2>Never used</h2>\n");
        a.unused().forEach((k, v) -> b.append("<p><b>").append(esc(k)).append("s:</b> ")
                .append(v.isEmpty() ? "none" : esc(String.join(", ", v))).append("</p>\n"));
        b.append("<h2>Deprecated terms used</h2>\n<p>").append(a.deprecatedUsed().isEmpty() ? "none"
                : esc(String.join(", ", a.deprecatedUsed().stream().map(u -> u.kind() + " " + u.name() + " (" + u.count() + ")").toList())))
                .append("</p>\n<h2>Terms used outside the card</h2>\n<p>");
        if (a.withCard() == 0) {
            b.append("unknown: no entry records its card's terms");
        } else if (a.offCard().isEmpty()) {
            b.append("none");
        } else {
            b.append(esc(String.join(", ", a.offCard().stream().map(o -> o.id() + " " + o.kind() + " " + o.name()).toList())));
        }
        b.append("</p></section>\n");
        tail(b);
        return b.toString();
    }

    // ---- pieces ----

    private static void head(StringBuilder b, String title) {
        b.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">\n<title>").append(esc(title)).append("</title>\n")
                .append("<style>\n")
                .append("body{font-family:system-ui,sans-serif;margin:2em auto;max-width:72em;color:#1d2733;padding:0 1em}\n")
                .append("h1{font-size:1.6em}h2{font-size:1.2em;margin-top:1.6em;border-bottom:1px solid #c9d2dc}\n")
                .append(".lead{color:#4a5866}.figures td{padding:.15em 1em .15em 0}.figures td:first-child{color:#4a5866}\n")
                .append("table.results{border-collapse:collapse;font-size:.85em;width:100%}\n")
                .append("table.results td,table.results th{border-bottom:1px solid #e2e7ec;padding:.3em;text-align:left;vertical-align:top}\n")
                .append("tr.correct td:nth-child(3){color:#1f7a4d}tr.wrong td:nth-child(3),tr.invalid td:nth-child(3){color:#b3372b}\n")
                .append("code{font-size:.95em;white-space:pre-wrap}svg text{font-size:12px;fill:#1d2733}.unused{font-size:.9em}\n")
                .append("</style></head><body>\n");
    }

    private static void tail(StringBuilder b) {
        b.append("<footer><p class=\"lead\">Written by termgate. Charts are inline SVG; the page loads nothing from elsewhere.</p></footer>\n</body></html>\n");
    }

    private static void figure(StringBuilder b, String name, String value) {
        b.append("<tr><td>").append(esc(name)).append("</td><td><b>").append(esc(value)).append("</b></td></tr>\n");
    }

    /** Horizontal bars scaled to {@code max}. */
    static String hbars(String id, List<Bar> bars, double max) {
        int labelW = 170;
        int barW = 360;
        int rowH = 24;
        int h = Math.max(1, bars.size()) * rowH + 10;
        StringBuilder s = new StringBuilder();
        s.append(String.format(Locale.ROOT, "<svg id=\"%s\" class=\"chart\" width=\"%d\" height=\"%d\" role=\"img\">%n",
                id, labelW + barW + 140, h));
        int y = 5;
        for (Bar bar : bars) {
            double w = max <= 0 ? 0 : Math.max(0, Math.min(1, bar.value() / max)) * barW;
            s.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", labelW - 8, y + 16, esc(bar.label())));
            s.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"#e8edf2\"/>%n", labelW, y + 3, barW, rowH - 8));
            s.append(String.format(Locale.ROOT, "<rect class=\"bar\" x=\"%d\" y=\"%d\" width=\"%.1f\" height=\"%d\" fill=\"#2f6f9f\"/>%n", labelW, y + 3, w, rowH - 8));
            s.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\">%s</text>%n", labelW + barW + 8, y + 16, esc(bar.text())));
            y += rowH;
        }
        s.append("</svg>\n");
        return s.toString();
    }

    /** Vertical bars of counts. */
    static String vbars(String id, Map<String, Integer> counts) {
        int colW = 90;
        int chartH = 160;
        int w = Math.max(1, counts.size()) * colW + 20;
        int max = counts.values().stream().mapToInt(Integer::intValue).max().orElse(1);
        StringBuilder s = new StringBuilder();
        s.append(String.format(Locale.ROOT, "<svg id=\"%s\" class=\"chart\" width=\"%d\" height=\"%d\" role=\"img\">%n",
                id, w, chartH + 45));
        int x = 10;
        for (Map.Entry<String, Integer> e : counts.entrySet()) {
            double h = max == 0 ? 0 : (double) e.getValue() / max * chartH;
            s.append(String.format(Locale.ROOT, "<rect class=\"bar\" x=\"%d\" y=\"%.1f\" width=\"%d\" height=\"%.1f\" fill=\"#2f6f9f\"/>%n",
                    x + 10, chartH - h + 15, colW - 20, h));
            s.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%.1f\" text-anchor=\"middle\">%d</text>%n", x + colW / 2, chartH - h + 11, e.getValue()));
            s.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\">%s</text>%n", x + colW / 2, chartH + 32, esc(e.getKey())));
            x += colW;
        }
        if (counts.isEmpty()) s.append("<text x=\"10\" y=\"20\">no attempts</text>\n");
        s.append("</svg>\n");
        return s.toString();
    }

    static String pct(double x) {
        return String.format(Locale.ROOT, "%.1f%%", 100 * x);
    }

    static String esc(String s) {
        if (s == null) return "";
        StringBuilder b = new StringBuilder(s.length());
        for (char c : s.toCharArray()) {
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&#39;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }
}
