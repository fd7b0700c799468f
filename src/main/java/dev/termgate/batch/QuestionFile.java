package dev.termgate.batch;

import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

/**
 * Reads the questions of a batch: plain text (one per line), CSV with a header (the column named by
 * {@code --column}, default {@code question}; an {@code id} column is used when present) or JSON lines (objects
 * with a {@code question} field and an optional {@code id}, or bare strings). The format follows the file
 * extension ({@code .csv}, {@code .jsonl}/{@code .ndjson}), else plain text.
 */
public final class QuestionFile {

    public enum Format { TEXT, CSV, JSONL }

    /**
     * @param notices what the user should know: blank lines skipped, duplicates asked once
     */
    public record Questions(List<BatchQuestion> questions, List<String> notices) {
        public Questions {
            questions = List.copyOf(questions);
            notices = List.copyOf(notices);
        }
    }

    /** The file is there but holds no usable question, or is malformed: the input was checked and is invalid. */
    public static final class Invalid extends Exception {
        public Invalid(String message) {
            super(message, null, false, false);
        }
    }

    private QuestionFile() {}

    public static Format formatOf(Path file) {
        String n = file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (n.endsWith(".csv")) return Format.CSV;
        if (n.endsWith(".jsonl") || n.endsWith(".ndjson")) return Format.JSONL;
        return Format.TEXT;
    }

    /**
     * @throws IOException when the file cannot be read
     * @throws Invalid     when it holds no questions or is malformed
     */
    public static Questions read(Path file, Optional<String> column) throws IOException, Invalid {
        String text = Files.readString(file, StandardCharsets.UTF_8);
        if (text.startsWith("\uFEFF")) text = text.substring(1);
        List<String[]> raw = switch (formatOf(file)) {
            case TEXT -> text(text);
            case CSV -> csv(text, column.orElse("question"), file);
            case JSONL -> jsonl(text, column.orElse("question"), file);
        };
        List<String> notices = new ArrayList<>();
        Map<String, BatchQuestion> byId = new LinkedHashMap<>();
        int blank = 0;
        for (String[] r : raw) {
            int line = Integer.parseInt(r[0]);
            String q = r[2] == null ? "" : r[2].strip();
            if (q.isEmpty()) {
                blank++;
                continue;
            }
            String id = r[1] != null && !r[1].isBlank() ? r[1].strip() : idOf(q);
            BatchQuestion earlier = byId.get(id);
            if (earlier != null) {
                if (!earlier.question().equals(q)) {
                    throw new Invalid(file + ":" + line + ": id '" + id + "' is already used by line " + earlier.line()
                            + " for another question");
                }
                notices.add(file + ":" + line + ": repeats the question of line " + earlier.line() + "; it is asked once");
                continue;
            }
            byId.put(id, new BatchQuestion(id, line, q));
        }
        if (blank > 0) notices.add(0, file + ": skipped " + blank + " blank " + (blank == 1 ? "entry" : "entries"));
        if (byId.isEmpty()) throw new Invalid(file + " holds no questions");
        return new Questions(new ArrayList<>(byId.values()), notices);
    }

    /** {@code q} and the first 12 hex digits of the SHA-256 of the question text. */
    public static String idOf(String question) {
        try {
            byte[] h = MessageDigest.getInstance("SHA-256").digest(question.strip().getBytes(StandardCharsets.UTF_8));
            return "q" + HexFormat.of().formatHex(h, 0, 6);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    private static List<String[]> text(String text) {
        List<String[]> out = new ArrayList<>();
        String[] lines = text.split("\\R", -1);
        for (int i = 0; i < lines.length; i++) {
            if (i == lines.length - 1 && lines[i].isEmpty()) break;
            out.add(new String[] {Integer.toString(i + 1), null, lines[i]});
        }
        return out;
    }

    private static List<String[]> jsonl(String text, String field, Path file) throws Invalid {
        List<String[]> out = new ArrayList<>();
        String[] lines = text.split("\\R", -1);
        for (int i = 0; i < lines.length; i++) {
            String l = lines[i].strip();
            if (l.isEmpty()) {
                if (i < lines.length - 1) out.add(new String[] {Integer.toString(i + 1), null, ""});
                continue;
            }
            JsonElement e;
            try {
                e = JsonParser.parseString(l);
            } catch (RuntimeException bad) {
                throw new Invalid(file + ":" + (i + 1) + ": not a JSON value");
            }
            if (e.isJsonPrimitive() && e.getAsJsonPrimitive().isString()) {
                out.add(new String[] {Integer.toString(i + 1), null, e.getAsString()});
            } else if (e.isJsonObject()) {
                JsonObject o = e.getAsJsonObject();
                JsonElement q = o.get(field);
                if (q == null || !q.isJsonPrimitive()) {
                    throw new Invalid(file + ":" + (i + 1) + ": no \"" + field + "\" text field");
                }
                JsonElement id = o.get("id");
                out.add(new String[] {Integer.toString(i + 1), id != null && id.isJsonPrimitive() ? id.getAsString() : null, q.getAsString()});
            } else {
                throw new Invalid(file + ":" + (i + 1) + ": expected an object with a \"" + field + "\" field or a string");
            }
        }
        return out;
    }

    private static List<String[]> csv(String text, String column, Path file) throws Invalid {
        List<List<String>> records = Csv.parse(text);
        if (records.isEmpty()) throw new Invalid(file + " holds no questions");
        List<String> header = records.get(0).stream().map(String::strip).toList();
        int q = indexOf(header, column);
        if (q < 0) throw new Invalid(file + ": no column '" + column + "' in the header (columns: " + String.join(", ", header) + ")");
        int id = indexOf(header, "id");
        List<String[]> out = new ArrayList<>();
        for (int i = 1; i < records.size(); i++) {
            List<String> r = records.get(i);
            if (r.size() == 1 && r.get(0).isBlank()) {
                out.add(new String[] {Integer.toString(i + 1), null, ""});
                continue;
            }
            out.add(new String[] {Integer.toString(i + 1), id >= 0 && id < r.size() ? r.get(id) : null, q < r.size() ? r.get(q) : ""});
        }
        return out;
    }

    private static int indexOf(List<String> header, String name) {
        for (int i = 0; i < header.size(); i++) if (header.get(i).equalsIgnoreCase(name)) return i;
        return -1;
    }

    /** RFC 4180 records: quoted fields may hold commas, doubled quotes and line breaks. */
    static final class Csv {
        private Csv() {}

        static List<List<String>> parse(String text) throws Invalid {
            List<List<String>> records = new ArrayList<>();
            List<String> rec = new ArrayList<>();
            StringBuilder f = new StringBuilder();
            boolean quoted = false;
            boolean any = false;
            for (int i = 0; i < text.length(); i++) {
                char c = text.charAt(i);
                if (quoted) {
                    if (c == '"') {
                        if (i + 1 < text.length() && text.charAt(i + 1) == '"') {
                            f.append('"');
                            i++;
                        } else {
                            quoted = false;
                        }
                    } else {
                        f.append(c);
                    }
                } else if (c == '"') {
                    quoted = true;
                    any = true;
                } else if (c == ',') {
                    rec.add(f.toString());
                    f.setLength(0);
                    any = true;
                } else if (c == '\n' || c == '\r') {
                    if (c == '\r' && i + 1 < text.length() && text.charAt(i + 1) == '\n') i++;
                    rec.add(f.toString());
                    records.add(rec);
                    rec = new ArrayList<>();
                    f.setLength(0);
                    any = false;
                } else {
                    f.append(c);
                    any = true;
                }
            }
            if (quoted) throw new Invalid("a quoted CSV field is not closed");
            if (any || f.length() > 0) {
                rec.add(f.toString());
                records.add(rec);
            }
            return records;
        }
    }
}
