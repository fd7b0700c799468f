package dev.termgate.cli.shell;

import dev.termgate.translate.ModelSettings;
import dev.termgate.translate.ModelTranslator;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.Prompts;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.ScriptedModelServer;
import dev.termgate.translate.ToyPipeline;
import dev.termgate.translate.Translator;
import org.jline.terminal.impl.DumbTerminal;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.PipedInputStream;
import java.io.PipedOutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The shell on a dumb terminal fed through a pipe (DEPENDENCIES.md, pitfall 6): what the screen shows. */
class ShellTest {

    /** Output the test reads while the shell writes. */
    static final class Screen extends ByteArrayOutputStream {
        synchronized String text() {
            return toString(StandardCharsets.UTF_8);
        }

        void waitFor(String s) throws InterruptedException {
            long until = System.nanoTime() + 60_000_000_000L;
            while (!text().contains(s)) {
                if (System.nanoTime() > until) throw new AssertionError("screen never showed '" + s + "':\n" + text());
                Thread.sleep(20);
            }
        }
    }

    @Test
    void questionsQueriesCommandsAndCtrlC(@TempDir Path dir) throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen ->
                seen.question().equals("a slow question")
                        ? ScriptedModelServer.delay(20_000, ScriptedModelServer.answer("MATCH (v:Vessel) RETURN v"))
                        : ScriptedModelServer.answer("```cypher\nMATCH (c:Carrier)-[:OPERATES]->(v:Vessel) RETURN c.name\n```"))) {
            ToyPipeline toy = new ToyPipeline();
            Pipeline pipeline = toy.open(null);
            ModelSettings settings = ModelSettings.resolve(Optional.of(server.modelOption("m1")), Optional.of(server.baseUrl()),
                    Optional.of(Duration.ofSeconds(30)), Map.of(), Optional.empty()).withRetries(0);
            Translator translator = ModelTranslator.create(settings, Prompts.builtIn(), 3);
            ShellState state = new ShellState(pipeline, translator, spec -> {
                throw new IllegalArgumentException("no such model here");
            }, 3, RunLimits.DEFAULT);

            PipedOutputStream keys = new PipedOutputStream();
            PipedInputStream in = new PipedInputStream(keys, 1 << 16);
            Screen screen = new Screen();
            Path history = dir.resolve("state").resolve("history");
            DumbTerminal terminal = new DumbTerminal("test", "dumb", in, screen, StandardCharsets.UTF_8);
            Thread shell = new Thread(() -> new Shell(terminal, state, Optional.of(history)).run());
            shell.start();
            screen.waitFor("Type a question, a query, or :help");

            type(keys, "which carrier operates which vessel\n");
            screen.waitFor("Northern Star");
            assertTrue(screen.text().contains("MATCH (c:Carrier)-[:OPERATES]->(v:Vessel) RETURN c.name"), screen.text());
            assertTrue(screen.text().contains("attempts: 1 of 3"), screen.text());

            type(keys, "MATCH (v:Vesel)\n  RETURN v.name\n");
            screen.waitFor("label 'Vesel' → 'Vessel'");
            assertEquals("MATCH (v:Vessel)\n  RETURN v.name", toy.ran.get(toy.ran.size() - 1), "a typed query is run as typed, after repair");

            type(keys, ":terms\n");
            screen.waitFor("label: Vessel");
            type(keys, ":plan\n");
            screen.waitFor("plan: stand-in for MATCH (v:Vessel)");
            type(keys, "MATCH (n) DETACH DELETE n;\n");
            screen.waitFor("(not run)");
            assertTrue(screen.text().contains("TG4001"), screen.text());
            type(keys, ":model ollama:x\n");
            screen.waitFor("model unchanged (openai:m1): no such model here");
            type(keys, ":format json\n");
            screen.waitFor("format: json");
            type(keys, ":limit rows 5\n");
            screen.waitFor("limits: 5 rows");

            int ranBefore = toy.ran.size();
            type(keys, "a slow question\n");
            long until = System.nanoTime() + 30_000_000_000L;
            while (server.seen().stream().noneMatch(s -> s.question().equals("a slow question"))) {
                assertTrue(System.nanoTime() < until, "the slow question reached the model");
                Thread.sleep(20);
            }
            type(keys, "\u0003");
            screen.waitFor("^C cancelled");
            assertEquals(ranBefore, toy.ran.size(), "nothing ran for the cancelled question");

            type(keys, "\u0003");
            screen.waitFor("nothing running; Ctrl-D leaves");
            type(keys, ":help\n");
            screen.waitFor(":card [QUESTION]");
            type(keys, "\u0004");
            shell.join(20_000);
            keys.close();
            assertFalse(shell.isAlive(), "Ctrl-D leaves the shell");
            assertTrue(screen.text().endsWith("bye\n") || screen.text().contains("bye"), screen.text());
            assertEquals("rw-------", PosixFilePermissions.toString(Files.getPosixFilePermissions(history)));
            String h = Files.readString(history);
            assertTrue(h.contains("which carrier operates which vessel"), h);
        }
    }

    @Test
    void continuationAndCompletionAndHighlighting() {
        assertTrue(ShellSyntax.incomplete("MATCH (v:Vessel"));
        assertTrue(ShellSyntax.incomplete("MATCH (v {name: 'a"));
        assertFalse(ShellSyntax.incomplete("what's the biggest port"), "an apostrophe in a question does not open a quote");
        assertTrue(ShellSyntax.incomplete("a long question \\"));
        assertTrue(ShellSyntax.incomplete("MATCH (v:Vessel)"), "no RETURN yet");
        assertFalse(ShellSyntax.incomplete("MATCH (v:Vessel) RETURN v"));
        assertFalse(ShellSyntax.incomplete("MATCH (n) DELETE n;"), "a semicolon ends it");
        assertFalse(ShellSyntax.incomplete("MATCH (n) DELETE n\n"), "so does an empty line");
        assertEquals("MATCH (v)\nRETURN v", ShellSyntax.joined("MATCH (v)\\\nRETURN v"));
        var c = ShellSyntax.completer(Shell.COMMANDS, java.util.List.of("Vessel", "Port"), java.util.List.of("CALLS_AT"), java.util.List.of("name"));
        var parsed = new ShellSyntax.Parser().parse("MATCH (v:Ves", 12);
        java.util.List<org.jline.reader.Candidate> found = new java.util.ArrayList<>();
        c.complete(null, parsed, found);
        assertTrue(found.stream().anyMatch(x -> x.value().equals("(v:Vessel")), found.toString());
        var cmd = new ShellSyntax.Parser().parse(":te", 3);
        found.clear();
        c.complete(null, cmd, found);
        assertTrue(found.stream().anyMatch(x -> x.value().equals(":terms")));
        var styled = ShellSyntax.highlighter().highlight(null, "MATCH (v:Return) RETURN v");
        assertEquals("MATCH (v:Return) RETURN v", styled.toString());
        assertTrue(styled.styleAt(0).getStyle() != styled.styleAt(6).getStyle(), "the keyword is styled");
        assertEquals(styled.styleAt(6).getStyle(), styled.styleAt(9).getStyle(), "a label named like a keyword is not");
    }

    private static void type(PipedOutputStream keys, String s) throws Exception {
        keys.write(s.getBytes(StandardCharsets.UTF_8));
        keys.flush();
    }
}
