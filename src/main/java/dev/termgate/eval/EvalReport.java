package dev.termgate.eval;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonObject;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermKind;
import dev.termgate.translate.Checked;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/** The figures of one evaluation run, computed from its results. */
public final class EvalReport {

    public static final String FORMAT = "termgate-eval/1";

    /** Correct answers and counted questions of one group (a shape or a split). */
    public record Share(int correct, int counted) {
        public double rate() {
            return counted == 0 ? 0 : (double) correct / counted;
        }
    }

    /** Ontology terms of one kind that the valid queries used, out of all the ontology has. */
    public record Coverage(String kind, Set<String> used, Set<String> all) {
        public Set<String> unused() {
            Set<String> out = new TreeSet<>(all);
            out.removeAll(used);
            return out;
        }
    }

    private final String model;
    private final List<EvalResult> results;
    private final long elapsedMillis;
    private final List<Coverage> coverage;

    public EvalReport(String model, List<EvalResult> results, long elapsedMillis, GraphSchema schema) {
        this.model = model;
        this.results = List.copyOf(results);
        this.elapsedMillis = elapsedMillis;
        this.coverage = coverage(results, schema);
    }

    public String model() {
        return model;
    }

    public List<EvalResult> results() {
        return results;
    }

    public long elapsedMillis() {
        return elapsedMillis;
    }

    public List<Coverage> coverage() {
        return coverage;
    }

    public int questions() {
        return results.size();
    }

    public int badGold() {
        return (int) results.stream().filter(r -> !r.counted()).count();
    }

    public int counted() {
        return questions() - badGold();
    }

    public int correct() {
        return (int) results.stream().filter(r -> r.status() == EvalResult.Status.CORRECT).count();
    }

    /** Execution accuracy over the questions with a usable gold query. */
    public double accuracy() {
        return counted() == 0 ? 0 : (double) correct() / counted();
    }

    public double shareValidAsWritten() {
        return share(r -> r.validAsWritten());
    }

    public double shareValidAfterRepair() {
        return share(r -> r.validAfterRepair());
    }

    public double shareValidFinal() {
        return share(r -> r.validFinal());
    }

    private double share(java.util.function.Predicate<EvalResult> p) {
        List<EvalResult> c = results.stream().filter(EvalResult::counted).toList();
        return c.isEmpty() ? 0 : (double) c.stream().filter(p).count() / c.size();
    }

    public Map<String, Share> byShape() {
        return groups(r -> r.shape());
    }

    public Map<String, Share> bySplit() {
        return groups(r -> r.split().orElse("all"));
    }

    private Map<String, Share> groups(java.util.function.Function<EvalResult, String> key) {
        Map<String, int[]> m = new TreeMap<>();
        for (EvalResult r : results) {
            if (!r.counted()) continue;
            int[] c = m.computeIfAbsent(key.apply(r), k -> new int[2]);
            c[1]++;
            if (r.status() == EvalResult.Status.CORRECT) c[0]++;
        }
        Map<String, Share> out = new LinkedHashMap<>();
        m.forEach((k, v) -> out.put(k, new Share(v[0], v[1])));
        return out;
    }

    public Map<String, Integer> byStatus() {
        Map<String, Integer> m = new LinkedHashMap<>();
        for (EvalResult.Status s : EvalResult.Status.values()) m.put(s.word(), 0);
        for (EvalResult r : results) m.merge(r.status().word(), 1, Integer::sum);
        return m;
    }

    public Map<String, Integer> repairsByKind() {
        Map<String, Integer> m = new TreeMap<>();
        for (EvalResult r : results) for (String k : r.repairs()) m.merge(k, 1, Integer::sum);
        return m;
    }

    /** Questions by number of attempts used (1 = answered on the first ask). */
    public Map<Integer, Integer> attemptsHistogram() {
        Map<Integer, Integer> m = new TreeMap<>();
        for (EvalResult r : results) if (r.attempts() > 0) m.merge(r.attempts(), 1, Integer::sum);
        return m;
    }

    public int reasked() {
        return (int) results.stream().filter(r -> r.attempts() > 1).count();
    }

    /** Sum of reported tokens, or null when the translator reported none. */
    public Integer promptTokens() {
        return sum(results.stream().map(EvalResult::promptTokens).toList());
    }

    public Integer completionTokens() {
        return sum(results.stream().map(EvalResult::completionTokens).toList());
    }

    private static Integer sum(List<Integer> xs) {
        int s = 0;
        boolean any = false;
        for (Integer x : xs) {
            if (x != null) {
                s += x;
                any = true;
            }
        }
        return any ? s : null;
    }

    public double meanMillis() {
        return results.stream().mapToLong(EvalResult::totalMillis).average().orElse(0);
    }

    public long medianMillis() {
        List<Long> t = results.stream().map(EvalResult::totalMillis).sorted().toList();
        return t.isEmpty() ? 0 : t.get(t.size() / 2);
    }

    public long maxMillis() {
        return results.stream().mapToLong(EvalResult::totalMillis).max().orElse(0);
    }

    private static List<Coverage> coverage(List<EvalResult> results, GraphSchema schema) {
        List<Coverage> out = new ArrayList<>();
        for (TermKind kind : TermKind.values()) {
            String word = word(kind);
            Set<String> all = new TreeSet<>();
            schema.terms(kind).forEach(t -> all.add(t.name()));
            Set<String> used = new TreeSet<>();
            for (EvalResult r : results) {
                for (Checked.TermUse t : r.terms()) if (t.kind().equals(word)) used.add(t.name());
            }
            out.add(new Coverage(word, used, all));
        }
        return out;
    }

    static String word(TermKind kind) {
        return switch (kind) {
            case LABEL -> "label";
            case RELATIONSHIP -> "relationship";
            case PROPERTY -> "property";
        };
    }

    // ---- output ----

    public JsonObject toJson() {
        JsonObject j = new JsonObject();
        j.addProperty("format", FORMAT);
        j.addProperty("model", model);
        j.addProperty("questions", questions());
        j.addProperty("bad_gold", badGold());
        j.addProperty("counted", counted());
        j.addProperty("correct", correct());
        j.addProperty("execution_accuracy", accuracy());
        j.addProperty("valid_as_written", shareValidAsWritten());
        j.addProperty("valid_after_repair", shareValidAfterRepair());
        j.addProperty("valid_after_reask", shareValidFinal());
        JsonObject shapes = new JsonObject();
        byShape().forEach((k, v) -> shapes.add(k, share(v)));
        j.add("by_shape", shapes);
        JsonObject splits = new JsonObject();
        bySplit().forEach((k, v) -> splits.add(k, share(v)));
        j.add("by_split", splits);
        JsonObject status = new JsonObject();
        byStatus().forEach(status::addProperty);
        j.add("by_status", status);
        JsonObject repairs = new JsonObject();
        repairsByKind().forEach(repairs::addProperty);
        j.add("repairs_by_kind", repairs);
        j.addProperty("reasked", reasked());
        JsonObject attempts = new JsonObject();
        attemptsHistogram().forEach((k, v) -> attempts.addProperty(String.valueOf(k), v));
        j.add("attempts", attempts);
        j.addProperty("prompt_tokens", promptTokens());
        j.addProperty("completion_tokens", completionTokens());
        JsonObject time = new JsonObject();
        time.addProperty("mean_ms", meanMillis());
        time.addProperty("median_ms", medianMillis());
        time.addProperty("max_ms", maxMillis());
        time.addProperty("total_ms", elapsedMillis);
        j.add("time_per_question", time);
        JsonObject cov = new JsonObject();
        for (Coverage c : coverage) {
            JsonObject x = new JsonObject();
            x.addProperty("used", c.used().size());
            x.addProperty("total", c.all().size());
            cov.add(c.kind(), x);
        }
        j.add("term_coverage", cov);
        JsonArray rs = new JsonArray();
        for (EvalResult r : results) {
            JsonObject x = new JsonObject();
            x.addProperty("id", r.id());
            x.addProperty("question", r.question());
            x.addProperty("shape", r.shape());
            x.addProperty("split", r.split().orElse(null));
            x.addProperty("status", r.status().word());
            x.addProperty("valid_as_written", r.validAsWritten());
            x.addProperty("valid_after_repair", r.validAfterRepair());
            x.addProperty("valid", r.validFinal());
            x.addProperty("attempts", r.attempts());
            JsonArray rep = new JsonArray();
            r.repairs().forEach(rep::add);
            x.add("repairs", rep);
            x.addProperty("prompt_tokens", r.promptTokens());
            x.addProperty("completion_tokens", r.completionTokens());
            x.addProperty("translate_ms", r.translateMillis());
            x.addProperty("total_ms", r.totalMillis());
            x.addProperty("query", r.query().orElse(null));
            x.addProperty("gold", r.gold());
            x.addProperty("detail", r.detail());
            rs.add(x);
        }
        j.add("results", rs);
        return j;
    }

    private static JsonObject share(Share s) {
        JsonObject x = new JsonObject();
        x.addProperty("correct", s.correct());
        x.addProperty("counted", s.counted());
        x.addProperty("accuracy", s.rate());
        return x;
    }

    public String json() {
        Gson g = new GsonBuilder().serializeNulls().disableHtmlEscaping().setPrettyPrinting().create();
        return g.toJson(toJson());
    }

    /** The terminal summary. */
    public String table() {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "Evaluation of %s on %d question(s)%s%n", model, questions(),
                badGold() > 0 ? " (" + badGold() + " with a bad gold query, not counted)" : ""));
        sb.append(String.format(Locale.ROOT, "  execution accuracy     %5.1f%%  (%d of %d)%n", 100 * accuracy(), correct(), counted()));
        sb.append(String.format(Locale.ROOT, "  valid as written       %5.1f%%%n", 100 * shareValidAsWritten()));
        sb.append(String.format(Locale.ROOT, "  valid after repair     %5.1f%%%n", 100 * shareValidAfterRepair()));
        sb.append(String.format(Locale.ROOT, "  valid after re-ask     %5.1f%%%n", 100 * shareValidFinal()));
        sb.append(String.format(Locale.ROOT, "  re-asked               %d question(s)%n", reasked()));
        sb.append(String.format(Locale.ROOT, "  time per question      mean %.0f ms, median %d ms, max %d ms (total %.1f s)%n",
                meanMillis(), medianMillis(), maxMillis(), elapsedMillis / 1000.0));
        sb.append(String.format(Locale.ROOT, "  tokens                 %s prompt, %s completion%n",
                promptTokens() == null ? "-" : promptTokens(), completionTokens() == null ? "-" : completionTokens()));
        sb.append("\nBy shape                 correct / counted\n");
        byShape().forEach((k, v) -> sb.append(String.format(Locale.ROOT, "  %-20s %5.1f%%  %d / %d%n", k, 100 * v.rate(), v.correct(), v.counted())));
        if (bySplit().size() > 1 || !bySplit().containsKey("all")) {
            sb.append("\nBy split\n");
            bySplit().forEach((k, v) -> sb.append(String.format(Locale.ROOT, "  %-20s %5.1f%%  %d / %d%n", k, 100 * v.rate(), v.correct(), v.counted())));
        }
        sb.append("\nOutcomes\n");
        byStatus().forEach((k, v) -> {
            if (v > 0) sb.append(String.format(Locale.ROOT, "  %-20s %d%n", k, v));
        });
        if (!repairsByKind().isEmpty()) {
            sb.append("\nRepairs by kind\n");
            repairsByKind().forEach((k, v) -> sb.append(String.format(Locale.ROOT, "  %-20s %d%n", k, v)));
        }
        sb.append("\nAttempts\n");
        attemptsHistogram().forEach((k, v) -> sb.append(String.format(Locale.ROOT, "  %d: %d question(s)%n", k, v)));
        sb.append("\nTerm coverage (terms used by valid queries)\n");
        for (Coverage c : coverage) {
            sb.append(String.format(Locale.ROOT, "  %-20s %d of %d%n", c.kind() + "s", c.used().size(), c.all().size()));
        }
        List<EvalResult> wrong = results.stream().filter(r -> r.status() != EvalResult.Status.CORRECT).toList();
        if (!wrong.isEmpty()) {
            sb.append("\nNot correct\n");
            for (EvalResult r : wrong) {
                sb.append(String.format(Locale.ROOT, "  %-8s %-14s %s%n", r.id(), r.status().word(), r.detail()));
            }
        }
        return sb.toString();
    }
}
