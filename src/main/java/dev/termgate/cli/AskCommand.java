package dev.termgate.cli;

import dev.termgate.diag.Code;
import dev.termgate.translate.Answer;
import dev.termgate.translate.AnswerJson;
import dev.termgate.translate.AnswerText;
import dev.termgate.translate.Asker;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.ServiceFailure;
import dev.termgate.translate.TranslationLoop;
import dev.termgate.translate.Translator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.io.PrintWriter;
import java.util.concurrent.Callable;

/** {@code termgate ask "question"}: one question, its checked query and rows on standard output. */
@Command(name = "ask", mixinStandardHelpOptions = true,
        description = "Ask one question in plain language; prints the checked query, its repairs, the ontology terms it uses and its rows.",
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:a valid query was found and ran",
                "1:no valid query after the attempts (the last diagnostics are shown), or the run failed",
                "2:usage error (bad option, missing API key, unreadable prompts)",
                "3:the model service or the graph server failed",
                "4:internal error"})
public final class AskCommand extends QuestionCommand implements Callable<Integer> {

    @Parameters(paramLabel = "QUESTION", arity = "1..*", description = "the question (several words are joined)")
    java.util.List<String> words;

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "text",
            description = "text, json (the batch record) or csv (rows only; the rest on standard error)")
    String format;

    @Option(names = "--with-rows", negatable = true, defaultValue = "true", description = "include rows in --format json (default: ${DEFAULT-VALUE})")
    boolean withRows;

    @Option(names = "--explain", description = "also show the plan that ran: the Gremlin traversals and the client-side steps")
    boolean explain;

    public AskCommand() {
        this(AskWiring.standard());
    }

    AskCommand(Pipeline.Factory factory) {
        super(factory);
    }

    @Override
    public Integer call() {
        if (!java.util.Set.of("text", "json", "csv").contains(format)) {
            throw new UserError(Exit.USAGE, "--format must be text, json or csv");
        }
        String question = String.join(" ", words).strip();
        if (question.isEmpty()) throw new UserError(Exit.USAGE, "the question is empty");
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        var settings = model.settings();
        var prompts = model.prompts();
        RunLimits limits = graph.limits();
        Pipeline pipeline = openPipeline(err);
        try {
            Translator translator = AskWiring.translator(settings, prompts, model.attempts, pipeline);
            Asker asker = new Asker(new TranslationLoop(translator, pipeline.gate(), pipeline.cards(), model.attempts), pipeline.runner());
            Answer answer;
            try {
                answer = asker.ask(question, limits);
            } catch (ServiceFailure f) {
                throw AskWiring.failed(f);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new UserError(Exit.INVALID, "cancelled");
            }
            switch (format) {
                case "json" -> {
                    var json = AnswerJson.of(answer, withRows);
                    if (explain) json.addProperty("plan", answer.run().map(r -> r.plan()).orElse(null));
                    out.println(AnswerJson.pretty(json));
                }
                case "csv" -> {
                    answer.run().filter(r -> !r.failed()).ifPresent(r -> out.print(dev.termgate.translate.Tables.csv(r.columns(), r.rows())));
                    err.print(AnswerText.render(withoutRun(answer), model.attempts, "text"));
                    answer.run().filter(r -> r.failed()).ifPresent(r -> err.print(AnswerText.rows(r, "text")));
                }
                default -> {
                    if (explain && answer.run().isPresent()) {
                        // The plan goes between the query and its rows, as in run --explain.
                        out.print(AnswerText.render(withoutRun(answer), model.attempts, "text"));
                        out.print(AnswerText.plan(answer.run().get()));
                        out.print(AnswerText.rows(answer.run().get(), "text"));
                    } else {
                        out.print(AnswerText.render(answer, model.attempts, "text"));
                    }
                }
            }
            out.flush();
            return exitCode(answer);
        } finally {
            AskWiring.closeQuietly(pipeline);
        }
    }

    private static Answer withoutRun(Answer a) {
        return new Answer(a.outcome(), java.util.Optional.empty(), a.runTime());
    }

    static int exitCode(Answer a) {
        if (!a.outcome().valid()) return Exit.INVALID;
        if (a.run().isEmpty() || !a.run().get().failed()) return Exit.OK;
        boolean remote = a.run().get().diagnostics().stream().anyMatch(d -> d.code() == Code.REMOTE_UNAVAILABLE);
        return remote ? Exit.SERVICE : Exit.INVALID;
    }
}
