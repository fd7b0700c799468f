package dev.termgate.schema;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import com.google.gson.JsonParseException;
import com.google.gson.JsonParser;
import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Severity;
import dev.termgate.query.Span;

import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * The derived schema as JSON: what {@code card --format json} prints and what the on-disk cache stores.
 * Deterministic (terms in schema order, sets sorted), and {@code fromJson(toJson(s))} gives a schema equal
 * term by term to {@code s}. A {@code null} endpoint side means "any class".
 */
public final class SchemaJson {

    /** Bumped whenever the layout changes, so that older cache files are not read. */
    public static final int FORMAT = 1;

    private static final Gson PRETTY = new GsonBuilder().serializeNulls().setPrettyPrinting().disableHtmlEscaping().create();
    private static final Gson COMPACT = new GsonBuilder().serializeNulls().disableHtmlEscaping().create();
    private static final Map<String, Code> CODES = new HashMap<>();

    static {
        for (Code c : Code.values()) CODES.put(c.id(), c);
    }

    private SchemaJson() {}

    /** Indented JSON, for people. */
    public static String toJson(GraphSchema schema) {
        return PRETTY.toJson(tree(schema));
    }

    /** One-line JSON, for the cache. */
    public static String toCompactJson(GraphSchema schema) {
        return COMPACT.toJson(tree(schema));
    }

    /** @throws IllegalArgumentException when the text is not a schema in this format */
    public static GraphSchema fromJson(String json) {
        try {
            JsonObject root = JsonParser.parseString(json).getAsJsonObject();
            int format = root.get("format").getAsInt();
            if (format != FORMAT) throw new IllegalArgumentException("schema JSON format " + format + ", expected " + FORMAT);
            List<NodeLabel> labels = new ArrayList<>();
            for (JsonElement e : root.getAsJsonArray("labels")) {
                JsonObject o = e.getAsJsonObject();
                labels.add(new NodeLabel(info(TermKind.LABEL, o), strings(o, "superLabels"), strings(o, "equivalents")));
            }
            List<RelType> rels = new ArrayList<>();
            for (JsonElement e : root.getAsJsonArray("relationshipTypes")) {
                JsonObject o = e.getAsJsonObject();
                List<Endpoint> eps = new ArrayList<>();
                for (JsonElement ep : o.getAsJsonArray("endpoints")) {
                    JsonObject p = ep.getAsJsonObject();
                    eps.add(new Endpoint(optString(p, "from"), optString(p, "to")));
                }
                rels.add(new RelType(info(TermKind.RELATIONSHIP, o), eps, strings(o, "superTypes"),
                        Optional.ofNullable(optString(o, "inverseOf")), o.get("symmetric").getAsBoolean()));
            }
            List<PropertyKey> keys = new ArrayList<>();
            for (JsonElement e : root.getAsJsonArray("propertyKeys")) {
                JsonObject o = e.getAsJsonObject();
                keys.add(new PropertyKey(info(TermKind.PROPERTY, o), strings(o, "domains"),
                        Optional.ofNullable(optString(o, "datatype")),
                        ValueType.valueOf(o.get("valueType").getAsString().toUpperCase(Locale.ROOT)), strings(o, "superKeys")));
            }
            List<Diagnostic> issues = new ArrayList<>();
            for (JsonElement e : root.getAsJsonArray("issues")) {
                JsonObject o = e.getAsJsonObject();
                Code code = CODES.get(o.get("code").getAsString());
                if (code == null) throw new IllegalArgumentException("unknown diagnostic code " + o.get("code"));
                issues.add(new Diagnostic(code, Severity.valueOf(o.get("severity").getAsString().toUpperCase(Locale.ROOT)),
                        Span.NONE, o.get("message").getAsString(), List.of()));
            }
            return GraphSchema.of(root.get("sourceHash").getAsString(), labels, rels, keys, issues);
        } catch (JsonParseException | IllegalStateException | NullPointerException | UnsupportedOperationException
                 | ClassCastException e) {
            throw new IllegalArgumentException("not a termgate schema JSON: " + e.getMessage(), e);
        }
    }

    private static JsonObject tree(GraphSchema s) {
        JsonObject root = new JsonObject();
        root.addProperty("format", FORMAT);
        root.addProperty("sourceHash", s.sourceHash());
        JsonArray labels = new JsonArray();
        for (NodeLabel l : s.labels().values()) {
            JsonObject o = info(l.info());
            o.add("superLabels", array(l.superLabels()));
            o.add("equivalents", array(l.equivalents()));
            labels.add(o);
        }
        root.add("labels", labels);
        JsonArray rels = new JsonArray();
        for (RelType r : s.relTypes().values()) {
            JsonObject o = info(r.info());
            JsonArray eps = new JsonArray();
            for (Endpoint e : r.endpoints()) {
                JsonObject ep = new JsonObject();
                ep.add("from", e.from() == null ? JsonNull.INSTANCE : new com.google.gson.JsonPrimitive(e.from()));
                ep.add("to", e.to() == null ? JsonNull.INSTANCE : new com.google.gson.JsonPrimitive(e.to()));
                eps.add(ep);
            }
            o.add("endpoints", eps);
            o.add("superTypes", array(r.superTypes()));
            o.addProperty("inverseOf", r.inverseOf().orElse(null));
            o.addProperty("symmetric", r.symmetric());
            rels.add(o);
        }
        root.add("relationshipTypes", rels);
        JsonArray keys = new JsonArray();
        for (PropertyKey p : s.properties().values()) {
            JsonObject o = info(p.info());
            o.add("domains", array(p.domains()));
            o.addProperty("datatype", p.datatype().orElse(null));
            o.addProperty("valueType", p.valueType().word());
            o.add("superKeys", array(p.superKeys()));
            keys.add(o);
        }
        root.add("propertyKeys", keys);
        JsonArray issues = new JsonArray();
        for (Diagnostic d : s.issues()) {
            JsonObject o = new JsonObject();
            o.addProperty("code", d.code().id());
            o.addProperty("severity", d.severity().word());
            o.addProperty("message", d.message());
            issues.add(o);
        }
        root.add("issues", issues);
        return root;
    }

    private static JsonObject info(TermInfo t) {
        JsonObject o = new JsonObject();
        o.addProperty("name", t.name());
        o.addProperty("iri", t.iri());
        o.add("labels", texts(t.labels()));
        o.add("altLabels", texts(t.altLabels()));
        o.add("comments", texts(t.comments()));
        o.addProperty("deprecated", t.deprecated());
        return o;
    }

    private static TermInfo info(TermKind kind, JsonObject o) {
        return new TermInfo(kind, o.get("iri").getAsString(), o.get("name").getAsString(), texts(o, "labels"),
                texts(o, "altLabels"), texts(o, "comments"), o.get("deprecated").getAsBoolean());
    }

    private static JsonArray texts(List<LangString> texts) {
        JsonArray a = new JsonArray();
        for (LangString t : texts) {
            JsonObject o = new JsonObject();
            o.addProperty("text", t.text());
            o.addProperty("lang", t.lang());
            a.add(o);
        }
        return a;
    }

    private static List<LangString> texts(JsonObject o, String field) {
        List<LangString> out = new ArrayList<>();
        for (JsonElement e : o.getAsJsonArray(field)) {
            JsonObject t = e.getAsJsonObject();
            out.add(new LangString(t.get("text").getAsString(), t.get("lang").getAsString()));
        }
        return out;
    }

    private static JsonArray array(Collection<String> values) {
        JsonArray a = new JsonArray();
        new TreeSet<>(values).forEach(a::add);
        return a;
    }

    private static Set<String> strings(JsonObject o, String field) {
        Set<String> out = new TreeSet<>();
        for (JsonElement e : o.getAsJsonArray(field)) out.add(e.getAsString());
        return out;
    }

    private static String optString(JsonObject o, String field) {
        JsonElement e = o.get(field);
        return e == null || e.isJsonNull() ? null : e.getAsString();
    }
}
