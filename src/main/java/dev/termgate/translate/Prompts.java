package dev.termgate.translate;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The prompt templates (see {@code prompts/README.md}): read from a user directory when given, else from the
 * copies packaged in the jar. Slots are filled in one pass, so text put into a slot is never expanded again.
 */
public final class Prompts {

    public static final String SYSTEM = "system.txt";
    public static final String ASK = "ask.txt";
    public static final String REASK = "reask.txt";
    public static final String EXAMPLES = "examples.txt";

    private static final Map<String, Set<String>> SLOTS = Map.of(
            SYSTEM, Set.of("card", "examples"),
            ASK, Set.of("question"),
            REASK, Set.of("question", "previous_query", "diagnostics", "candidates", "attempt", "attempts_left"),
            EXAMPLES, Set.of());
    private static final Pattern SLOT = Pattern.compile("\\{\\{\\s*([a-z_]+)\\s*}}");

    private final Map<String, String> templates;

    private Prompts(Map<String, String> templates) {
        this.templates = Map.copyOf(templates);
    }

    /** The built-in templates. */
    public static Prompts builtIn() {
        return load(Optional.empty());
    }

    /**
     * @param dir a directory of user copies; a file missing there falls back to the built-in one
     * @throws IllegalArgumentException when a template names a slot that does not exist, or cannot be read
     */
    public static Prompts load(Optional<Path> dir) {
        Map<String, String> t = new LinkedHashMap<>();
        for (String name : SLOTS.keySet()) {
            String text = dir.map(d -> d.resolve(name)).filter(Files::isRegularFile).map(Prompts::read)
                    .orElseGet(() -> resource(name));
            Matcher m = SLOT.matcher(text);
            while (m.find()) {
                if (!SLOTS.get(name).contains(m.group(1))) {
                    throw new IllegalArgumentException("prompt template " + name + " names the slot {{" + m.group(1)
                            + "}}, which does not exist; its slots are " + SLOTS.get(name));
                }
            }
            t.put(name, text);
        }
        return new Prompts(t);
    }

    /** Fills a template's slots; a slot with no value becomes empty. */
    public String fill(String template, Map<String, String> values) {
        String text = templates.get(template);
        if (text == null) throw new IllegalArgumentException("no prompt template " + template);
        Matcher m = SLOT.matcher(text);
        StringBuilder sb = new StringBuilder();
        while (m.find()) {
            m.appendReplacement(sb, Matcher.quoteReplacement(values.getOrDefault(m.group(1), "")));
        }
        m.appendTail(sb);
        return sb.toString();
    }

    public String raw(String template) {
        return templates.get(template);
    }

    private static String read(Path p) {
        try {
            return Files.readString(p, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new IllegalArgumentException("cannot read prompt template " + p + ": " + e.getMessage());
        }
    }

    private static String resource(String name) {
        try (InputStream in = Prompts.class.getResourceAsStream("/prompts/" + name)) {
            if (in == null) throw new IllegalStateException("built-in prompt template " + name + " is missing from the jar");
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
