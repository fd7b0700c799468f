package dev.termgate.card;

import com.google.gson.Gson;
import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonPrimitive;
import com.google.gson.JsonNull;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.SchemaJson;

import java.util.Optional;

/**
 * A card as JSON, one shape for the whole-ontology card and for a question card (README, "Schema card"):
 * <pre>
 * { "cardFormat": 1, "question": null|"…", "encoding": "cl100k_base", "tokens": 1234, "budget": null|1500,
 *   "leftOut": 0, "fallback": false, "notices": [],
 *   "terms": [{"kind": "label"|"relationship"|"property", "name", "iri", "score": null|0.92, "evidence": []}],
 *   "text": "the card",
 *   "schema": { the shown schema in {@link SchemaJson}'s layout: the whole schema, or the question's part } }
 * </pre>
 */
public final class CardJson {

    /** Bumped whenever the layout above changes. */
    public static final int FORMAT = 1;

    private static final Gson PRETTY = new GsonBuilder().serializeNulls().setPrettyPrinting().disableHtmlEscaping().create();

    private CardJson() {}

    public static String toJson(Card card, GraphSchema schema, Optional<String> question) {
        JsonObject root = new JsonObject();
        root.addProperty("cardFormat", FORMAT);
        root.add("question", question.<JsonElement>map(JsonPrimitive::new)
                .orElse(JsonNull.INSTANCE));
        root.addProperty("encoding", card.encoding().id());
        root.addProperty("tokens", card.tokens());
        if (card.budget().isPresent()) root.addProperty("budget", card.budget().getAsInt());
        else root.add("budget", JsonNull.INSTANCE);
        root.addProperty("leftOut", card.leftOut());
        root.addProperty("fallback", card.fallback());
        JsonArray notices = new JsonArray();
        card.notices().forEach(notices::add);
        root.add("notices", notices);
        JsonArray terms = new JsonArray();
        for (CardTerm t : card.terms()) {
            JsonObject o = new JsonObject();
            o.addProperty("kind", kindWord(t));
            o.addProperty("name", t.name());
            o.addProperty("iri", t.iri());
            if (t.score().isPresent()) o.addProperty("score", t.score().getAsDouble());
            else o.add("score", JsonNull.INSTANCE);
            JsonArray ev = new JsonArray();
            t.evidence().forEach(ev::add);
            o.add("evidence", ev);
            terms.add(o);
        }
        root.add("terms", terms);
        root.addProperty("text", card.text());
        GraphSchema shown = card.budget().isEmpty() ? schema : SubSchema.of(schema, card.scope());
        root.add("schema", JsonParser.parseString(SchemaJson.toCompactJson(shown)));
        return PRETTY.toJson(root) + "\n";
    }

    private static String kindWord(CardTerm t) {
        return switch (t.kind()) {
            case LABEL -> "label";
            case RELATIONSHIP -> "relationship";
            case PROPERTY -> "property";
        };
    }
}
