package dev.termgate.cli.shell;

import dev.termgate.translate.Answer;
import dev.termgate.translate.Checked;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.RunResult;
import dev.termgate.translate.Translator;

import java.util.Optional;

/** What a shell session remembers between lines. Only the shell's thread changes it. */
public final class ShellState {

    /** Makes a translator for a {@code PROVIDER:MODEL} text; throws IllegalArgumentException with a user message. */
    public interface TranslatorMaker {
        Translator make(String modelSpec);
    }

    final Pipeline pipeline;
    final TranslatorMaker translators;
    final int attempts;
    Translator translator;
    RunLimits limits;
    String format = "text";
    String lastQuestion = "";
    Optional<Checked> lastChecked = Optional.empty();
    Optional<RunResult> lastRun = Optional.empty();
    Optional<Answer> lastAnswer = Optional.empty();

    public ShellState(Pipeline pipeline, Translator translator, TranslatorMaker translators, int attempts, RunLimits limits) {
        this.pipeline = pipeline;
        this.translator = translator;
        this.translators = translators;
        this.attempts = attempts;
        this.limits = limits;
    }
}
