package dev.termgate.cli;

import dev.termgate.eval.EvalQuestion;
import dev.termgate.eval.EvalReport;
import dev.termgate.eval.EvalResult;
import dev.termgate.eval.Evaluator;
import dev.termgate.eval.HtmlReport;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.TranslationLoop;
import dev.termgate.translate.Translator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;

/** {@code termgate eval --questions FILE}: translate questions with gold queries, run both, compare the rows. */
@Command(name = "eval", mixinStandardHelpOptions = true,
        description = {"Evaluate the offline interpreter or a model on questions with gold queries.",
                "Each line of the file is a JSON object with id, question, gold and optionally shape and split."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:the evaluation ran (whatever the accuracy)",
                "1:the question file is malformed (the message names the line)",
                "2:usage error (bad option, unreadable file, unwritable report)",
                "3:the model service failed for every question",
                "4:internal error"})
public final class EvalCommand extends QuestionCommand implements Callable<Integer> {

    @Option(names = "--questions", required = true, paramLabel = "FILE", description = "JSON lines: id, question, gold[, shape, split]")
    Path questions;

    @Option(names = "--split", paramLabel = "NAME", description = "only the questions whose split field is NAME")
    String split;

    @Option(names = "--format", paramLabel = "table|json", defaultValue = "table", description = "output: table (default) or json")
    String format;

    @Option(names = "--html", paramLabel = "FILE", description = "also write a self-contained HTML report with charts")
    Path html;

    public EvalCommand() {
        this(AskWiring.standard());
    }

    EvalCommand(Pipeline.Factory factory) {
        super(factory);
    }

    @Override
    public Integer call() throws InterruptedException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!format.equals("table") && !format.equals("json")) throw new UserError(Exit.USAGE, "--format takes table or json");
        List<EvalQuestion> qs = readQuestions();
        if (split != null) {
            qs = qs.stream().filter(q -> q.split().map(split::equals).orElse(false)).toList();
            if (qs.isEmpty()) throw new UserError(Exit.INVALID, questions + " has no question with split '" + split + "'");
        }
        var settings = model.settings();
        var prompts = model.prompts();
        RunLimits limits = graph.limits();
        // Results are compared whole: no row cap, the time limit stays.
        RunLimits whole = new RunLimits(limits.timeout(), Integer.MAX_VALUE);
        Pipeline pipeline = openPipeline(err);
        try {
            Translator translator = AskWiring.translator(settings, prompts, model.attempts, pipeline);
            TranslationLoop loop = new TranslationLoop(translator, pipeline.gate(), pipeline.cards(), model.attempts);
            Evaluator evaluator = new Evaluator(loop, pipeline.gate(), pipeline.runner(), whole);
            List<EvalResult> results = new ArrayList<>();
            long t0 = System.nanoTime();
            for (EvalQuestion q : qs) results.add(evaluator.evaluate(q));
            EvalReport report = new EvalReport(translator.name(), results, (System.nanoTime() - t0) / 1_000_000, pipeline.schema());
            if (html != null) write(html, HtmlReport.eval(report));
            out.print(format.equals("json") ? report.json() + "\n" : report.table());
            out.flush();
            if (results.stream().allMatch(r -> r.status() == EvalResult.Status.SERVICE_FAILED)) {
                throw new UserError(Exit.SERVICE, "the model service failed for every question: " + results.get(0).detail());
            }
            if (html != null) err.println("termgate: wrote " + html);
            return Exit.OK;
        } finally {
            AskWiring.closeQuietly(pipeline);
        }
    }

    private List<EvalQuestion> readQuestions() {
        if (!Files.isRegularFile(questions)) throw new UserError(Exit.USAGE, "cannot read " + questions + ": no such file");
        try {
            return EvalQuestion.read(questions);
        } catch (java.nio.charset.MalformedInputException e) {
            throw new UserError(Exit.INVALID, questions + " is not UTF-8 text");
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot read " + questions + ": " + e.getMessage());
        } catch (EvalQuestion.Invalid e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        }
    }

    static void write(Path file, String text) {
        try {
            Files.writeString(file, text, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot write " + file + ": " + (e instanceof java.nio.file.AccessDeniedException
                    ? "permission denied" : e instanceof java.nio.file.NoSuchFileException ? "no such directory" : e.getMessage()));
        }
    }
}
