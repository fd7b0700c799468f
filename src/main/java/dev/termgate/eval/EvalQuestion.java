package dev.termgate.eval;

import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonParseException;
import com.google.gson.JsonParser;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * One question of an evaluation set: a JSON line with {@code id}, {@code question}, {@code gold} and, optionally,
 * {@code shape} and {@code split}.
 *
 * @param line the 1-based line of the file it came from, for messages
 */
public record EvalQuestion(String id, int line, String question, String gold, String shape, Optional<String> split) {

    /** The file cannot be evaluated; the message names the line. */
    public static final class Invalid extends Exception {
        public Invalid(String message) {
            super(message, null, false, false);
        }
    }

    /** Reads every question; blank lines are skipped. */
    public static List<EvalQuestion> read(Path file) throws IOException, Invalid {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        List<EvalQuestion> out = new ArrayList<>();
        Set<String> ids = new HashSet<>();
        for (int i = 0; i < lines.size(); i++) {
            String text = lines.get(i).strip();
            if (text.isEmpty()) continue;
            int line = i + 1;
            JsonObject o;
            try {
                JsonElement e = JsonParser.parseString(text);
                if (!e.isJsonObject()) throw new Invalid(where(file, line) + "expected a JSON object");
                o = e.getAsJsonObject();
            } catch (JsonParseException e) {
                throw new Invalid(where(file, line) + "not valid JSON");
            }
            String id = field(o, "id", file, line);
            String question = field(o, "question", file, line);
            String gold = field(o, "gold", file, line);
            if (!ids.add(id)) throw new Invalid(where(file, line) + "id '" + id + "' is used twice");
            String shape = optional(o, "shape").orElse("unspecified");
            out.add(new EvalQuestion(id, line, question, gold, shape, optional(o, "split")));
        }
        if (out.isEmpty()) throw new Invalid(file + " holds no questions");
        return out;
    }

    private static String field(JsonObject o, String name, Path file, int line) throws Invalid {
        JsonElement e = o.get(name);
        if (e == null || e.isJsonNull()) throw new Invalid(where(file, line) + "the field '" + name + "' is missing");
        if (!e.isJsonPrimitive()) throw new Invalid(where(file, line) + "the field '" + name + "' must be a string");
        String s = e.getAsString().strip();
        if (s.isEmpty()) throw new Invalid(where(file, line) + "the field '" + name + "' is empty");
        return s;
    }

    private static Optional<String> optional(JsonObject o, String name) {
        JsonElement e = o.get(name);
        return e == null || e.isJsonNull() || !e.isJsonPrimitive() ? Optional.empty() : Optional.of(e.getAsString());
    }

    private static String where(Path file, int line) {
        return file.getFileName() + " line " + line + ": ";
    }
}
