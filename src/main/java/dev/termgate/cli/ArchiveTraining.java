package dev.termgate.cli;

import dev.termgate.translate.ModelSettings;
import dev.termgate.translate.ModelSpec;
import dev.termgate.translate.ModelTranslator;
import dev.termgate.translate.Prompts;
import dev.termgate.translate.Translators;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;

/**
 * What the launcher trains its class-data archive on, once per build: the start-up paths of the usual commands,
 * so that later starts map those classes from the archive instead of loading and verifying them. It runs the
 * demo card whole and for a question (schema linking with the embedding model), a question through the offline
 * interpreter, the gate and the engine on the demo graph, a one-question batch, and the model client of both
 * chat protocols against the loopback stand-in service. Nothing leaves the process and nothing is printed; the
 * batch writes into a temporary directory, removed at the end. Not a command: the launcher runs this class.
 */
public final class ArchiveTraining {
    private ArchiveTraining() {}

    /** The demo question the training asks (the demo ontology has vessels, ports and port calls). */
    static final String QUESTION = "which vessels called at a port";

    public static void main(String[] args) throws IOException {
        int failed = train();
        Translators.releaseAtExit();
        System.exit(failed == 0 ? 0 : 1);
    }

    /** @return how many of the training steps failed (the archive is then left out by the launcher) */
    static int train() throws IOException {
        PrintWriter quiet = new PrintWriter(Writer.nullWriter());
        Path dir = Files.createTempDirectory("termgate-archive-training");
        int failed = 0;
        try {
            Path questions = Files.writeString(dir.resolve("questions.txt"), QUESTION + "\n");
            for (List<String> line : List.of(
                    List.of("card"),
                    List.of("card", "--question", QUESTION),
                    List.of("ask", "--model", "offline", QUESTION),
                    List.of("batch", "--model", "offline", "--questions", questions.toString(),
                            "--out", dir.resolve("answers.jsonl").toString(), "--no-progress"))) {
                if (Main.run(line.toArray(String[]::new), quiet, quiet) != Exit.OK) failed++;
            }
            for (String model : List.of("openai:m", "ollama:m")) {
                ModelSettings s = new ModelSettings(ModelSpec.parse(model), "http://127.0.0.1", Optional.empty(),
                        ModelSettings.DEFAULT_TIMEOUT, 0, 0);
                try {
                    ModelTranslator.rehearse(s, Prompts.builtIn(), 3);
                } catch (RuntimeException e) {
                    failed++;
                }
            }
        } finally {
            try (Stream<Path> files = Files.walk(dir)) {
                files.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
        return failed;
    }
}
