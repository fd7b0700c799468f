package dev.termgate.cli;

import dev.termgate.batch.BatchRun;
import dev.termgate.batch.BatchQuestion;
import dev.termgate.batch.Progress;
import dev.termgate.batch.QuestionFile;
import dev.termgate.batch.ResultLog;
import dev.termgate.translate.Asker;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.TranslationLoop;
import dev.termgate.translate.Translator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;

/** {@code termgate batch --questions FILE --out FILE.jsonl}: many questions, one JSON line each, resumable. */
@Command(name = "batch", mixinStandardHelpOptions = true,
        description = {"Ask every question of a file and record one JSON line per question.",
                "Run it again with the same --out to do only the questions that have no result yet."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:every question has a result in the output file (valid or not)",
                "1:the question file holds no questions or is malformed",
                "2:usage error (bad option, unreadable question file, unwritable output, missing API key)",
                "3:the model service failed: questions were left without a result (rerun to finish them), or the provider refused the key or the model name",
                "4:internal error"})
public final class BatchCommand extends QuestionCommand implements Callable<Integer> {

    /** Cards built ahead per job: enough to never leave a worker waiting, few enough to keep memory flat (common practice). */
    static final int PREFETCH_PER_JOB = 4;

    /**
     * Workers per model request slot: half of them wait for replies while the other half check replies, run
     * queries and ready the next requests, so that a slot freed by a reply is taken again at once (without them,
     * the model sat idle for each reply's check; BatchThroughputBench).
     */
    static final int WORKERS_PER_JOB = 2;

    @Option(names = "--questions", required = true, paramLabel = "FILE",
            description = "questions: text (one per line), .csv (with a header) or .jsonl")
    Path questions;

    @Option(names = "--out", required = true, paramLabel = "FILE.jsonl", description = "results, one JSON object per line; appended to")
    Path out;

    @Option(names = "--column", paramLabel = "NAME", description = "the question column of a CSV file or field of a JSON-lines file (default: question)")
    String column;

    @Option(names = "--jobs", paramLabel = "N", defaultValue = "4", description = "model requests out at a time; with the offline interpreter, questions at once (default: ${DEFAULT-VALUE})")
    int jobs;

    @Option(names = "--with-rows", description = "record the rows, not only their count")
    boolean withRows;

    @Option(names = "--no-progress", description = "print no progress")
    boolean noProgress;

    public BatchCommand() {
        this(AskWiring.standard());
    }

    BatchCommand(Pipeline.Factory factory) {
        super(factory);
    }

    @Override
    public Integer call() throws IOException, InterruptedException {
        PrintWriter err = spec.commandLine().getErr();
        if (jobs < 1 || jobs > 256) throw new UserError(Exit.USAGE, "--jobs must be between 1 and 256");
        var settings = model.settings().withInFlight(jobs);
        var prompts = model.prompts();
        var limits = graph.limits();
        QuestionFile.Questions qs = readQuestions();
        qs.notices().forEach(n -> err.println("termgate: " + n));
        // Open the output before anything costly, so a bad path is reported at once and nothing is asked in vain.
        try (ResultLog log = openLog()) {
            log.notices().forEach(n -> err.println("termgate: " + n));
            List<BatchQuestion> todo = BatchRun.todo(qs.questions(), log);
            if (todo.isEmpty()) {
                err.println("termgate: all " + qs.questions().size() + " questions already have a result in " + out);
                return Exit.OK;
            }
            // The offline interpreter reads no card (Translator.readsCard): only a model's cards are built ahead.
            Optional<PipelineSpec.CardsAhead> ahead = settings.spec().offline() ? Optional.empty()
                    : Optional.of(new PipelineSpec.CardsAhead(todo.stream().map(BatchQuestion::question).toList(),
                    PREFETCH_PER_JOB * jobs));
            AskWiring.rehearseInBackground(settings, prompts);
            Pipeline pipeline = openPipeline(err, ahead);
            try {
                int workers = settings.spec().offline() ? jobs : WORKERS_PER_JOB * jobs;
                return run(pipeline, AskWiring.translator(settings, prompts, model.attempts, pipeline), workers, qs, todo,
                        log, limits, err);
            } finally {
                AskWiring.closeQuietly(pipeline);
            }
        } catch (ResultLog.Unusable e) {
            throw new UserError(Exit.USAGE, e.getMessage());
        }
    }

    private int run(Pipeline pipeline, Translator translator, int workers, QuestionFile.Questions qs, List<BatchQuestion> todo, ResultLog log,
                    RunLimits limits, PrintWriter err) throws IOException, InterruptedException {
        Asker asker = new Asker(new TranslationLoop(translator, pipeline.gate(), pipeline.cards(), model.attempts),
                pipeline.runner());
        BatchRun.Summary s;
        try (Progress progress = new Progress(err, System.console() != null, todo.size(), !noProgress)) {
            s = new BatchRun(asker, limits, workers, withRows).run(qs.questions(), log, progress);
        }
        err.printf("termgate: %d asked (%d valid, %d without a valid query), %d already done, %d left without a result, %.1f s%n",
                s.asked(), s.valid(), s.invalid(), s.skipped(), s.unfinished(), s.elapsed().toMillis() / 1000.0);
        if (s.stoppedBy().isPresent()) {
            throw AskWiring.failed(s.stoppedBy().get());
        }
        if (s.unfinished() > 0) {
            throw new UserError(Exit.SERVICE, s.unfinished() + " question(s) have no result because the model service failed ("
                    + s.lastFailure().orElse("no detail") + "); run the same command again to finish them");
        }
        return Exit.OK;
    }

    private QuestionFile.Questions readQuestions() {
        if (!Files.exists(questions)) throw new UserError(Exit.USAGE, "cannot read " + questions + ": no such file");
        if (Files.isDirectory(questions)) throw new UserError(Exit.USAGE, "cannot read " + questions + ": it is a directory");
        try {
            return QuestionFile.read(questions, Optional.ofNullable(column));
        } catch (java.nio.charset.MalformedInputException e) {
            throw new UserError(Exit.INVALID, questions + " is not UTF-8 text");
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot read " + questions + ": "
                    + (e instanceof java.nio.file.AccessDeniedException ? "permission denied" : e.getMessage()));
        } catch (QuestionFile.Invalid e) {
            throw new UserError(Exit.INVALID, e.getMessage());
        }
    }

    private ResultLog openLog() throws ResultLog.Unusable {
        if (out.toAbsolutePath().normalize().equals(questions.toAbsolutePath().normalize())) {
            throw new ResultLog.Unusable("--out must not be the question file");
        }
        return ResultLog.open(out);
    }
}
