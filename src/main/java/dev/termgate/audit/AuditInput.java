package dev.termgate.audit;

import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonParseException;
import com.google.gson.JsonParser;
import dev.termgate.translate.AnswerJson;
import dev.termgate.translate.Checked;
import dev.termgate.translate.QueryGate;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/** Reads what the audit command audits: a batch output file, or a file of queries separated by blank lines. */
public final class AuditInput {

    /** The file cannot be audited; the message says why and where. */
    public static final class Invalid extends Exception {
        public Invalid(String message) {
            super(message, null, false, false);
        }
    }

    /** Entries and things the user should know (a cut-off last line that was skipped). */
    public record Read(List<AuditEntry> entries, List<String> notices) {}

    private AuditInput() {}

    /**
     * A batch output ({@value AnswerJson#FORMAT} lines). A line of another format version is refused with a
     * message naming both versions; a cut-off last line (a run killed mid-write) is skipped with a notice.
     */
    public static Read batch(Path file) throws IOException, Invalid {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        List<AuditEntry> out = new ArrayList<>();
        List<String> notices = new ArrayList<>();
        int last = lines.size();
        while (last > 0 && lines.get(last - 1).isBlank()) last--;
        for (int i = 0; i < last; i++) {
            String text = lines.get(i).strip();
            if (text.isEmpty()) continue;
            int line = i + 1;
            JsonObject o;
            try {
                JsonElement e = JsonParser.parseString(text);
                if (!e.isJsonObject()) throw new JsonParseException("not an object");
                o = e.getAsJsonObject();
            } catch (JsonParseException | IllegalStateException e) {
                if (line == last) {
                    notices.add(file.getFileName() + " line " + line + ": skipped an unfinished last line");
                    continue;
                }
                throw new Invalid(file.getFileName() + " line " + line + ": not a JSON object; is this a batch output file?");
            }
            JsonElement format = o.get("format");
            if (format == null || !format.isJsonPrimitive()) {
                throw new Invalid(file.getFileName() + " line " + line + ": no format field; this is not a batch output of termgate"
                        + " (expected format " + AnswerJson.FORMAT + ")");
            }
            if (!format.getAsString().equals(AnswerJson.FORMAT)) {
                throw new Invalid(file.getFileName() + " line " + line + ": written in format " + format.getAsString()
                        + ", which this version of termgate cannot read (it reads " + AnswerJson.FORMAT
                        + "); audit it with the version that wrote it, or run the batch again");
            }
            out.add(entry(o, line));
        }
        if (out.isEmpty()) throw new Invalid(file.getFileName() + " holds no results to audit");
        return new Read(out, notices);
    }

    private static AuditEntry entry(JsonObject o, int line) {
        String id = str(o, "id").orElse("line " + line);
        List<Checked.TermUse> terms = new ArrayList<>();
        if (o.get("terms") instanceof JsonArray a) {
            for (JsonElement e : a) {
                if (!e.isJsonObject()) continue;
                JsonObject t = e.getAsJsonObject();
                terms.add(new Checked.TermUse(str(t, "kind").orElse(""), str(t, "name").orElse(""), str(t, "iri").orElse(""),
                        str(t, "via").orElse("direct")));
            }
        }
        Optional<List<String>> card = Optional.empty();
        if (o.get("card_terms") instanceof JsonArray a) {
            List<String> names = new ArrayList<>();
            for (JsonElement e : a) if (e.isJsonPrimitive()) names.add(e.getAsString());
            card = Optional.of(names);
        }
        boolean valid = o.get("valid") != null && o.get("valid").isJsonPrimitive() && o.get("valid").getAsBoolean();
        return new AuditEntry(id, line, str(o, "question"), str(o, "query"), valid, str(o, "model"), card, terms);
    }

    private static Optional<String> str(JsonObject o, String name) {
        JsonElement e = o.get(name);
        return e == null || e.isJsonNull() || !e.isJsonPrimitive() ? Optional.empty() : Optional.of(e.getAsString());
    }

    /**
     * A JSON line where queries are expected is a batch output given to {@code --queries} (whose lines would
     * otherwise all be reported as invalid queries): say so, with its format version when it is another one.
     */
    private static void refuseBatchOutput(Path file, List<String> lines) throws Invalid {
        for (int i = 0; i < lines.size(); i++) {
            String text = lines.get(i).strip();
            if (text.isEmpty()) continue;
            if (!text.startsWith("{")) return;
            JsonElement format;
            try {
                JsonElement e = JsonParser.parseString(text);
                format = e.isJsonObject() ? e.getAsJsonObject().get("format") : null;
            } catch (JsonParseException e) {
                return;
            }
            if (format == null || !format.isJsonPrimitive()) return;
            String f = format.getAsString();
            String where = file.getFileName() + " line " + (i + 1) + ": ";
            if (f.equals(AnswerJson.FORMAT)) {
                throw new Invalid(where + "this is a batch output (format " + f + "), not a file of queries; audit it as"
                        + " FILE.jsonl, without --queries");
            }
            throw new Invalid(where + "this is a JSON file written in format " + f + ", not a file of queries; this version"
                    + " of termgate audits queries separated by blank lines, or batch outputs in format " + AnswerJson.FORMAT);
        }
    }

    /** Queries separated by blank lines, each checked by the gate for the terms it uses. */
    public static Read queries(Path file, QueryGate gate) throws IOException, Invalid {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        refuseBatchOutput(file, lines);
        List<AuditEntry> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        int start = 0;
        for (int i = 0; i <= lines.size(); i++) {
            boolean blank = i == lines.size() || lines.get(i).isBlank();
            if (!blank) {
                if (cur.length() == 0) start = i + 1;
                cur.append(lines.get(i)).append('\n');
                continue;
            }
            if (cur.length() == 0) continue;
            String text = cur.toString().strip();
            cur.setLength(0);
            Checked c = gate.check(text);
            out.add(new AuditEntry("q" + (out.size() + 1), start, Optional.empty(), Optional.of(text), c.valid(), Optional.empty(),
                    Optional.empty(), c.terms()));
        }
        if (out.isEmpty()) throw new Invalid(file.getFileName() + " holds no queries");
        return new Read(out, List.of());
    }
}
