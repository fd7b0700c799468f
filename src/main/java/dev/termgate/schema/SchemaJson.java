package dev.termgate.schema;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import com.google.gson.JsonParseException;
import com.google.gson.stream.JsonReader;
import com.google.gson.stream.JsonToken;
import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Severity;
import dev.termgate.query.Span;

import java.io.IOException;
import java.io.StringReader;
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
        // Streamed rather than through a JSON tree: reading the cache is on the start-up path (schema.org: 1 MB).
        try (JsonReader r = new JsonReader(new StringReader(json))) {
            int format = -1;
            String hash = null;
            List<NodeLabel> labels = new ArrayList<>();
            List<RelType> rels = new ArrayList<>();
            List<PropertyKey> keys = new ArrayList<>();
            List<Diagnostic> issues = new ArrayList<>();
            r.beginObject();
            while (r.hasNext()) {
                switch (r.nextName()) {
                    case "format" -> format = r.nextInt();
                    case "sourceHash" -> hash = r.nextString();
                    case "labels" -> readArray(r, () -> labels.add(readLabel(r)));
                    case "relationshipTypes" -> readArray(r, () -> rels.add(readRel(r)));
                    case "propertyKeys" -> readArray(r, () -> keys.add(readKey(r)));
                    case "issues" -> readArray(r, () -> issues.add(readIssue(r)));
                    default -> r.skipValue();
                }
            }
            r.endObject();
            if (format != FORMAT) throw new IllegalArgumentException("schema JSON format " + format + ", expected " + FORMAT);
            if (hash == null) throw new IllegalArgumentException("schema JSON without sourceHash");
            return GraphSchema.of(hash, labels, rels, keys, issues);
        } catch (IOException | IllegalStateException | NullPointerException | JsonParseException e) {
            throw new IllegalArgumentException("not a termgate schema JSON: " + e.getMessage(), e);
        }
    }

    /** The fields every term has, read as they come; the rest go to {@code extra}. */
    private static final class TermFields {
        String name;
        String iri;
        List<LangString> labels = List.of();
        List<LangString> altLabels = List.of();
        List<LangString> comments = List.of();
        boolean deprecated;

        boolean read(JsonReader r, String field) throws IOException {
            switch (field) {
                case "name" -> name = r.nextString();
                case "iri" -> iri = r.nextString();
                case "labels" -> labels = readTexts(r);
                case "altLabels" -> altLabels = readTexts(r);
                case "comments" -> comments = readTexts(r);
                case "deprecated" -> deprecated = r.nextBoolean();
                default -> {
                    return false;
                }
            }
            return true;
        }

        TermInfo info(TermKind kind) {
            if (name == null || iri == null) throw new IllegalStateException("a term without name or iri");
            return new TermInfo(kind, iri, name, labels, altLabels, comments, deprecated);
        }
    }

    private static NodeLabel readLabel(JsonReader r) throws IOException {
        TermFields t = new TermFields();
        Set<String> supers = Set.of();
        Set<String> equivalents = Set.of();
        r.beginObject();
        while (r.hasNext()) {
            String f = r.nextName();
            if (t.read(r, f)) continue;
            switch (f) {
                case "superLabels" -> supers = readStrings(r);
                case "equivalents" -> equivalents = readStrings(r);
                default -> r.skipValue();
            }
        }
        r.endObject();
        return new NodeLabel(t.info(TermKind.LABEL), supers, equivalents);
    }

    private static RelType readRel(JsonReader r) throws IOException {
        TermFields t = new TermFields();
        List<Endpoint> endpoints = new ArrayList<>();
        Set<String> supers = Set.of();
        String inverse = null;
        boolean symmetric = false;
        r.beginObject();
        while (r.hasNext()) {
            String f = r.nextName();
            if (t.read(r, f)) continue;
            switch (f) {
                case "endpoints" -> readArray(r, () -> {
                    String from = null;
                    String to = null;
                    r.beginObject();
                    while (r.hasNext()) {
                        switch (r.nextName()) {
                            case "from" -> from = optString(r);
                            case "to" -> to = optString(r);
                            default -> r.skipValue();
                        }
                    }
                    r.endObject();
                    endpoints.add(new Endpoint(from, to));
                });
                case "superTypes" -> supers = readStrings(r);
                case "inverseOf" -> inverse = optString(r);
                case "symmetric" -> symmetric = r.nextBoolean();
                default -> r.skipValue();
            }
        }
        r.endObject();
        return new RelType(t.info(TermKind.RELATIONSHIP), endpoints, supers, Optional.ofNullable(inverse), symmetric);
    }

    private static PropertyKey readKey(JsonReader r) throws IOException {
        TermFields t = new TermFields();
        Set<String> domains = Set.of();
        Set<String> supers = Set.of();
        String datatype = null;
        ValueType vt = ValueType.ANY;
        r.beginObject();
        while (r.hasNext()) {
            String f = r.nextName();
            if (t.read(r, f)) continue;
            switch (f) {
                case "domains" -> domains = readStrings(r);
                case "datatype" -> datatype = optString(r);
                case "valueType" -> vt = ValueType.valueOf(r.nextString().toUpperCase(Locale.ROOT));
                case "superKeys" -> supers = readStrings(r);
                default -> r.skipValue();
            }
        }
        r.endObject();
        return new PropertyKey(t.info(TermKind.PROPERTY), domains, Optional.ofNullable(datatype), vt, supers);
    }

    private static Diagnostic readIssue(JsonReader r) throws IOException {
        Code code = null;
        Severity severity = null;
        String message = null;
        r.beginObject();
        while (r.hasNext()) {
            switch (r.nextName()) {
                case "code" -> {
                    String id = r.nextString();
                    code = CODES.get(id);
                    if (code == null) throw new IllegalStateException("unknown diagnostic code " + id);
                }
                case "severity" -> severity = Severity.valueOf(r.nextString().toUpperCase(Locale.ROOT));
                case "message" -> message = r.nextString();
                default -> r.skipValue();
            }
        }
        r.endObject();
        if (code == null || severity == null || message == null) throw new IllegalStateException("incomplete issue");
        return new Diagnostic(code, severity, Span.NONE, message, List.of());
    }

    private interface Item {
        void read() throws IOException;
    }

    private static void readArray(JsonReader r, Item item) throws IOException {
        r.beginArray();
        while (r.hasNext()) item.read();
        r.endArray();
    }

    private static List<LangString> readTexts(JsonReader r) throws IOException {
        List<LangString> out = new ArrayList<>();
        readArray(r, () -> {
            String text = null;
            String lang = "";
            r.beginObject();
            while (r.hasNext()) {
                switch (r.nextName()) {
                    case "text" -> text = r.nextString();
                    case "lang" -> lang = r.nextString();
                    default -> r.skipValue();
                }
            }
            r.endObject();
            out.add(new LangString(text, lang));
        });
        return out;
    }

    private static Set<String> readStrings(JsonReader r) throws IOException {
        List<String> out = new ArrayList<>();
        readArray(r, () -> out.add(r.nextString()));
        return Set.copyOf(out);
    }

    private static String optString(JsonReader r) throws IOException {
        if (r.peek() == JsonToken.NULL) {
            r.nextNull();
            return null;
        }
        return r.nextString();
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

    private static JsonArray array(Collection<String> values) {
        JsonArray a = new JsonArray();
        new TreeSet<>(values).forEach(a::add);
        return a;
    }

}
