package dev.termgate.cli;

import dev.termgate.translate.ToyPipeline;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** Commands for tests outside this package (benchmarks). */
public final class TestCommands {
    private TestCommands() {}

    /** {@code batch} with the shipped pipeline: demo ontology, parser, analyzer, embedded demo graph. */
    public static CliRun.Result shippedBatch(Path questions, Path out, String... extra) {
        List<String> args = new ArrayList<>(List.of("--questions", questions.toString(), "--out", out.toString()));
        args.addAll(List.of(extra));
        return CliRun.run(new BatchCommand(), CliRun.withEnv(CliRun.env()), args.toArray(String[]::new));
    }

    /** {@code batch} with the stand-in pipeline (no ontology). */
    public static CliRun.Result batch(Path questions, Path out, String... extra) {
        List<String> args = new ArrayList<>(List.of("--questions", questions.toString(), "--out", out.toString(), "--schema-free"));
        args.addAll(List.of(extra));
        return CliRun.run(new BatchCommand(new ToyPipeline()), CliRun.withEnv(CliRun.env()), args.toArray(String[]::new));
    }
}
