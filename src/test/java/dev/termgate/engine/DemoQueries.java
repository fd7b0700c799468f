package dev.termgate.engine;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** The demo scenario's gold queries (examples/maritime/questions.jsonl) and its schema, shared by tests. */
final class DemoQueries {
    private static GraphSchema schema;

    private DemoQueries() {}

    record Gold(String id, String query) {}

    static synchronized GraphSchema schema() {
        if (schema == null) schema = OntologyLoader.load(List.of(OntologyLoader.DEMO)).schema();
        return schema;
    }

    static List<Gold> gold() {
        try {
            List<Gold> out = new ArrayList<>();
            for (String line : Files.readAllLines(Path.of("examples/maritime/questions.jsonl"), StandardCharsets.UTF_8)) {
                if (line.isBlank()) continue;
                JsonObject o = JsonParser.parseString(line).getAsJsonObject();
                out.add(new Gold(o.get("id").getAsString(), o.get("gold").getAsString()));
            }
            return out;
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }
}
