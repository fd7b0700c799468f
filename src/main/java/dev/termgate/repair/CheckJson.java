package dev.termgate.repair;

import com.google.gson.JsonArray;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import dev.termgate.analyze.TermUse;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Span;

/**
 * The JSON form of a {@link CheckResult} ({@code termgate check --format json}): {@code valid}, {@code canonical},
 * {@code diagnostics} (code, severity, line, column, message, suggestions), {@code repaired}, {@code edits},
 * {@code remaining} and {@code terms} (kind, name, iri, via).
 */
public final class CheckJson {
    private CheckJson() {}

    public static JsonObject of(CheckResult r) {
        return of(r, 0);
    }

    /**
     * With {@code lineOffset} added to every line number (for a query that starts further down a file; lines
     * then count from the start of the file).
     */
    public static JsonObject of(CheckResult r, int lineOffset) {
        JsonObject o = new JsonObject();
        o.addProperty("valid", r.valid());
        // canonical: the text that would run (the repaired one when repaired); null when the query is invalid
        add(o, "canonical", r.valid() ? r.finalText() : null);
        o.add("diagnostics", diagnostics(r.diagnostics(), lineOffset));
        add(o, "repaired", r.repaired().orElse(null));
        JsonArray edits = new JsonArray();
        for (Edit e : r.edits()) {
            JsonObject j = new JsonObject();
            j.addProperty("kind", e.kind().name().toLowerCase(java.util.Locale.ROOT));
            position(j, e.span(), lineOffset);
            j.addProperty("before", e.before());
            j.addProperty("after", e.after());
            j.addProperty("reason", e.reason());
            edits.add(j);
        }
        o.add("edits", edits);
        if (r.wasRepaired()) o.add("remaining", diagnostics(r.remaining(), lineOffset));
        JsonArray terms = new JsonArray();
        for (TermUse t : r.terms()) {
            JsonObject j = new JsonObject();
            j.addProperty("kind", switch (t.kind()) {
                case LABEL -> "label";
                case RELATIONSHIP -> "relationship";
                case PROPERTY -> "property";
            });
            j.addProperty("name", t.name());
            j.addProperty("iri", t.iri());
            j.addProperty("via", t.via().word());
            terms.add(j);
        }
        o.add("terms", terms);
        return o;
    }

    private static JsonArray diagnostics(java.util.List<Diagnostic> ds, int lineOffset) {
        JsonArray a = new JsonArray();
        for (Diagnostic d : ds) {
            JsonObject j = new JsonObject();
            j.addProperty("code", d.code().id());
            j.addProperty("severity", d.severity().word());
            position(j, d.span(), lineOffset);
            j.addProperty("message", d.message());
            JsonArray s = new JsonArray();
            d.suggestions().forEach(s::add);
            j.add("suggestions", s);
            a.add(j);
        }
        return a;
    }

    private static void position(JsonObject j, Span s, int lineOffset) {
        if (s.isNone()) {
            j.add("line", JsonNull.INSTANCE);
            j.add("column", JsonNull.INSTANCE);
        } else {
            j.addProperty("line", s.startLine() + lineOffset);
            j.addProperty("column", s.startColumn());
        }
    }

    private static void add(JsonObject o, String key, String value) {
        if (value == null) o.add(key, JsonNull.INSTANCE);
        else o.addProperty(key, value);
    }
}
