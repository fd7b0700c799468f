package dev.termgate.translate;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import com.google.gson.JsonPrimitive;
import dev.termgate.diag.Diagnostic;

import java.time.Duration;
import java.util.List;
import java.util.Map;

/**
 * The JSON form of an answer: one line of a batch file, and {@code ask --format json}. Field names are part
 * of the documented format (README, "Asking in plain language"); {@code format} names its version so that
 * readers (the audit command) can refuse a file they do not understand.
 */
public final class AnswerJson {

    public static final String FORMAT = "termgate-answer/1";

    private static final Gson COMPACT = new GsonBuilder().serializeNulls().disableHtmlEscaping().create();
    private static final Gson PRETTY = new GsonBuilder().serializeNulls().disableHtmlEscaping().setPrettyPrinting().create();

    private AnswerJson() {}

    public static JsonObject of(Answer a, boolean withRows) {
        Outcome o = a.outcome();
        JsonObject j = new JsonObject();
        j.addProperty("format", FORMAT);
        j.addProperty("question", o.question());
        j.addProperty("query", o.accepted().map(Checked::query).orElse(null));
        j.addProperty("valid", o.valid());
        if (!o.valid()) j.addProperty("rejected_query", o.lastQuery().orElse(null));
        j.add("diagnostics", diagnostics(o.diagnostics()));
        JsonArray edits = new JsonArray();
        o.accepted().ifPresent(c -> c.edits().forEach(e -> {
            JsonObject x = new JsonObject();
            x.addProperty("what", e.what());
            x.addProperty("where", e.where());
            x.addProperty("why", e.why());
            edits.add(x);
        }));
        j.add("edits", edits);
        j.addProperty("attempts", o.attempts().size());
        j.addProperty("model", o.model());
        j.addProperty("card_tokens", o.card().tokens());
        j.add("card_terms", strings(o.card().terms()));
        j.add("prompt_tokens", o.promptTokens().isPresent() ? new JsonPrimitive(o.promptTokens().getAsInt()) : JsonNull.INSTANCE);
        j.add("completion_tokens", o.completionTokens().isPresent() ? new JsonPrimitive(o.completionTokens().getAsInt()) : JsonNull.INSTANCE);
        JsonArray terms = new JsonArray();
        o.accepted().ifPresent(c -> c.terms().forEach(t -> {
            JsonObject x = new JsonObject();
            x.addProperty("kind", t.kind());
            x.addProperty("name", t.name());
            x.addProperty("iri", t.iri());
            x.addProperty("via", t.via());
            terms.add(x);
        }));
        j.add("terms", terms);
        if (a.run().isPresent()) {
            RunResult r = a.run().get();
            j.addProperty("row_count", r.rows().size());
            j.addProperty("truncated", r.truncated());
            j.add("run_diagnostics", diagnostics(r.diagnostics()));
            if (withRows) {
                j.add("columns", strings(r.columns()));
                JsonArray rows = new JsonArray();
                r.rows().forEach(row -> {
                    JsonArray x = new JsonArray();
                    row.forEach(v -> x.add(value(v)));
                    rows.add(x);
                });
                j.add("rows", rows);
            }
        } else {
            j.add("row_count", JsonNull.INSTANCE);
        }
        JsonObject t = new JsonObject();
        t.addProperty("card_ms", ms(o.cardTime()));
        t.addProperty("translate_ms", ms(o.translateTime()));
        t.addProperty("run_ms", ms(a.runTime()));
        t.addProperty("total_ms", ms(o.cardTime().plus(o.translateTime()).plus(a.runTime())));
        j.add("timings", t);
        return j;
    }

    public static JsonArray diagnostics(List<Diagnostic> ds) {
        JsonArray arr = new JsonArray();
        for (Diagnostic d : ds) {
            JsonObject x = new JsonObject();
            x.addProperty("code", d.code().id());
            x.addProperty("severity", d.severity().word());
            x.addProperty("message", d.message());
            if (!d.span().isNone()) {
                x.addProperty("line", d.span().startLine());
                x.addProperty("column", d.span().startColumn());
            }
            x.add("suggestions", strings(d.suggestions()));
            arr.add(x);
        }
        return arr;
    }

    /** Plain values (as {@link RunResult} holds them) to JSON. */
    public static JsonElement value(Object v) {
        if (v == null) return JsonNull.INSTANCE;
        if (v instanceof Number n) return new JsonPrimitive(n);
        if (v instanceof Boolean b) return new JsonPrimitive(b);
        if (v instanceof List<?> l) {
            JsonArray a = new JsonArray();
            l.forEach(x -> a.add(value(x)));
            return a;
        }
        if (v instanceof Map<?, ?> m) {
            JsonObject o = new JsonObject();
            m.forEach((k, x) -> o.add(String.valueOf(k), value(x)));
            return o;
        }
        return new JsonPrimitive(String.valueOf(v));
    }

    private static JsonArray strings(List<String> xs) {
        JsonArray a = new JsonArray();
        xs.forEach(a::add);
        return a;
    }

    private static long ms(Duration d) {
        return d.toMillis();
    }

    /** One line, no line breaks inside (JSON escapes them), as a JSON-lines file needs. */
    public static String line(JsonObject o) {
        return COMPACT.toJson(o);
    }

    public static String pretty(JsonElement o) {
        return PRETTY.toJson(o);
    }
}
