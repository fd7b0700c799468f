package dev.termgate.cli.shell;

import dev.termgate.translate.Answer;
import dev.termgate.translate.AnswerJson;
import dev.termgate.translate.AnswerText;
import dev.termgate.translate.Asker;
import dev.termgate.translate.CardSource;
import dev.termgate.translate.Checked;
import dev.termgate.translate.QueryExtractor;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.RunResult;
import dev.termgate.translate.ServiceFailure;
import dev.termgate.translate.TranslationLoop;
import dev.termgate.translate.Translator;
import org.jline.reader.EndOfFileException;
import org.jline.reader.LineReader;
import org.jline.reader.LineReaderBuilder;
import org.jline.reader.UserInterruptException;
import org.jline.terminal.Terminal;
import org.jline.utils.NonBlockingReader;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.concurrent.CancellationException;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

/**
 * The interactive shell. A line that starts with a clause keyword is a query: it is checked and run as typed.
 * Any other line is a question for the translator. Lines starting with {@code :} are the shell's own commands.
 * Ctrl-C stops the running step and returns to the prompt; Ctrl-D leaves.
 */
public final class Shell {

    static final List<String> COMMANDS = List.of(":help", ":card", ":terms", ":plan", ":model", ":limit", ":format", ":quit");
    static final String PROMPT = "tg> ";
    static final String MORE = "..> ";

    private final Terminal terminal;
    private final PrintWriter out;
    private final ShellState state;
    private final Optional<Path> historyFile;
    private final ExecutorService worker = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "termgate-shell-step");
        t.setDaemon(true);
        return t;
    });

    public Shell(Terminal terminal, ShellState state, Optional<Path> historyFile) {
        this.terminal = terminal;
        interruptOnCtrlC(terminal);
        this.out = terminal.writer();
        this.state = state;
        this.historyFile = historyFile;
    }

    /** Reads and handles lines until Ctrl-D or {@code :quit}. */
    public void run() {
        LineReader reader = reader();
        out.println("termgate shell, model " + state.translator.name() + ". Type a question, a query, or :help. Ctrl-D leaves.");
        out.flush();
        try {
            while (true) {
                String line;
                try {
                    line = reader.readLine(PROMPT);
                } catch (UserInterruptException e) {
                    out.println("^C (nothing running; Ctrl-D leaves)");
                    out.flush();
                    continue;
                } catch (EndOfFileException e) {
                    break;
                }
                String input = ShellSyntax.joined(line);
                if (input.isEmpty()) continue;
                if (!handle(input)) break;
                out.flush();
            }
        } finally {
            worker.shutdownNow();
            saveHistory(reader);
        }
        out.println("bye");
        out.flush();
    }

    private LineReader reader() {
        var schema = state.pipeline.schema();
        LineReaderBuilder b = LineReaderBuilder.builder()
                .terminal(terminal)
                .appName("termgate")
                .parser(new ShellSyntax.Parser())
                .highlighter(ShellSyntax.highlighter())
                .completer(ShellSyntax.completer(COMMANDS, List.copyOf(schema.labels().keySet()),
                        List.copyOf(schema.relTypes().keySet()), List.copyOf(schema.properties().keySet())))
                .variable(LineReader.SECONDARY_PROMPT_PATTERN, MORE)
                .variable(LineReader.HISTORY_SIZE, 2_000)
                .option(LineReader.Option.DISABLE_EVENT_EXPANSION, true);
        historyFile.ifPresent(f -> {
            preparePrivateFile(f);
            b.variable(LineReader.HISTORY_FILE, f);
        });
        return b.build();
    }

    /** Handles one input; false to leave. */
    boolean handle(String input) {
        if (input.startsWith(":")) return command(input);
        if (input.startsWith("?")) {
            question(input.substring(1).strip());
        } else if (QueryExtractor.startsWithClause(input)) {
            query(input);
        } else {
            question(input);
        }
        return true;
    }

    private void question(String q) {
        if (q.isEmpty()) return;
        state.lastQuestion = q;
        Translator translator = state.translator;
        Asker asker = new Asker(new TranslationLoop(translator, state.pipeline.gate(), state.pipeline.cards(), state.attempts),
                state.pipeline.runner());
        RunLimits limits = state.limits;
        Optional<Answer> answer = step(() -> asker.ask(q, limits));
        answer.ifPresent(a -> {
            state.lastAnswer = Optional.of(a);
            state.lastChecked = a.outcome().accepted();
            state.lastRun = a.run();
            out.print(state.format.equals("json") ? AnswerJson.pretty(AnswerJson.of(a, true)) + "\n"
                    : AnswerText.render(a, state.attempts, state.format));
        });
    }

    private void query(String text) {
        Optional<Checked> checked = step(() -> state.pipeline.gate().check(text));
        if (checked.isEmpty()) return;
        Checked c = checked.get();
        if (!c.valid()) {
            out.print(c.report().isBlank() ? AnswerText.diagnostics(c.diagnostics()) : c.report());
            out.println("(not run)");
            return;
        }
        state.lastChecked = Optional.of(c);
        if (!c.edits().isEmpty()) {
            out.println("repaired:");
            out.println("  " + c.query());
            c.edits().forEach(e -> out.println("  " + e));
        }
        if (!c.diagnostics().isEmpty()) out.print(AnswerText.diagnostics(c.diagnostics()));
        RunLimits limits = state.limits;
        Optional<RunResult> run = step(() -> state.pipeline.runner().run(c, limits));
        run.ifPresent(r -> {
            state.lastRun = Optional.of(r);
            out.print(AnswerText.rows(r, state.format));
        });
    }

    private boolean command(String input) {
        String[] parts = input.split("\\s+", 2);
        String arg = parts.length > 1 ? parts[1].strip() : "";
        switch (parts[0].toLowerCase(Locale.ROOT)) {
            case ":help", ":h", ":?" -> out.print(help());
            case ":quit", ":q", ":exit" -> {
                return false;
            }
            case ":card" -> {
                String q = arg.isEmpty() ? state.lastQuestion : arg;
                Optional<CardSource.Card> card = step(() -> state.pipeline.cards().card(q));
                card.ifPresent(c -> {
                    out.print(c.text().endsWith("\n") ? c.text() : c.text() + "\n");
                    out.println("(" + c.tokens() + " tokens" + (q.isEmpty() ? ", whole schema" : ", for: " + q) + ")");
                });
            }
            case ":terms" -> out.print(state.lastChecked.map(c -> AnswerText.terms(c.terms()))
                    .orElse("no query yet: ask a question or type a query first\n"));
            case ":plan" -> out.println(state.lastRun.map(RunResult::plan).filter(p -> !p.isBlank())
                    .orElse("no plan yet: run a query first"));
            case ":model" -> model(arg);
            case ":limit" -> limit(arg);
            case ":format" -> {
                if (arg.isEmpty()) {
                    state.format = state.format.equals("text") ? "json" : "text";
                } else if (List.of("text", "json", "csv").contains(arg)) {
                    state.format = arg;
                } else {
                    out.println("formats: text, json, csv");
                    return true;
                }
                out.println("format: " + state.format);
            }
            default -> out.println("unknown command " + parts[0] + "; :help lists the commands");
        }
        return true;
    }

    private void model(String arg) {
        if (arg.isEmpty()) {
            out.println("model: " + state.translator.name());
            return;
        }
        try {
            state.translator = state.translators.make(arg);
            out.println("model: " + state.translator.name());
        } catch (IllegalArgumentException e) {
            out.println("model unchanged (" + state.translator.name() + "): " + e.getMessage());
        }
    }

    private void limit(String arg) {
        String[] p = arg.split("\\s+");
        try {
            if (p.length == 2 && p[0].equals("rows")) {
                state.limits = new RunLimits(state.limits.timeout(), Integer.parseInt(p[1]));
            } else if (p.length == 2 && p[0].equals("time")) {
                state.limits = new RunLimits(Duration.ofMillis(Math.round(Double.parseDouble(p[1]) * 1000)), state.limits.maxRows());
            } else if (!arg.isEmpty()) {
                out.println("usage: :limit rows N | :limit time SECONDS");
                return;
            }
        } catch (IllegalArgumentException e) {
            out.println("usage: :limit rows N | :limit time SECONDS (" + e.getMessage() + ")");
            return;
        }
        out.println("limits: " + state.limits.maxRows() + " rows, " + state.limits.timeout().toMillis() / 1000.0 + " s");
    }

    static String help() {
        return """
                Type a question in plain language, or a query starting with MATCH, WITH, RETURN, … (checked, then run).
                Start a line with ? to ask it as a question even if it begins like a query.
                A line ending with \\ continues on the next; a query continues while a bracket or quote is open.
                  :card [QUESTION]       the schema card for the question (default: the last one)
                  :terms                 the ontology terms the last query used
                  :plan                  the plan of the last run
                  :model [PROVIDER:MODEL] show or switch the model (openai:…, ollama:…, offline)
                  :limit rows N | time S set the row cap or the time limit of runs
                  :format [text|json|csv] set (or toggle text/json) the output format
                  :help                  this text
                  :quit                  leave (or Ctrl-D)
                Ctrl-C stops the running step. Tab completes labels, relationship types, properties and commands.
                """;
    }

    /** A piece of work the user can stop with Ctrl-C. */
    interface Step<T> {
        T run() throws Exception;
    }

    /**
     * Runs a step on the worker thread. Ctrl-C (SIGINT, or the interrupt character read from a terminal that has
     * no signals) cancels it and returns to the prompt; its result is then dropped.
     */
    <T> Optional<T> step(Step<T> step) {
        Future<T> f = worker.submit(step::run);
        Terminal.SignalHandler previous = terminal.handle(Terminal.Signal.INT, s -> f.cancel(true));
        try {
            NonBlockingReader keys = terminal.reader();
            boolean inputOpen = true;
            while (true) {
                try {
                    return Optional.ofNullable(f.get(inputOpen ? 50 : 500, TimeUnit.MILLISECONDS));
                } catch (TimeoutException notYet) {
                    // Reading lets a terminal without signals turn a typed Ctrl-C into Signal.INT.
                    if (inputOpen) {
                        try {
                            int c = keys.read(10);
                            if (c == NonBlockingReader.EOF) inputOpen = false;
                            // A terminal with signals off hands the interrupt character over as a key.
                            if (c == 3) f.cancel(true);
                        } catch (IOException e) {
                            inputOpen = false;
                        }
                    }
                }
            }
        } catch (CancellationException e) {
            out.println("^C cancelled");
            return Optional.empty();
        } catch (InterruptedException e) {
            f.cancel(true);
            Thread.currentThread().interrupt();
            return Optional.empty();
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof ServiceFailure sf) {
                out.println(sf.getMessage().equals("cancelled") ? "^C cancelled" : "the model service failed: " + sf.getMessage());
            } else if (c instanceof InterruptedException) {
                out.println("^C cancelled");
            } else if (c instanceof IllegalArgumentException iae) {
                out.println(iae.getMessage());
            } else {
                out.println("internal error: " + c + " (please report it)");
            }
            return Optional.empty();
        } finally {
            terminal.handle(Terminal.Signal.INT, previous);
            out.flush();
        }
    }

    /** A dumb terminal starts with signals off and no end-of-file key; Ctrl-C and Ctrl-D must still work as on any terminal. */
    private static void interruptOnCtrlC(Terminal terminal) {
        org.jline.terminal.Attributes a = terminal.getAttributes();
        if (!a.getLocalFlag(org.jline.terminal.Attributes.LocalFlag.ISIG)) {
            a.setLocalFlag(org.jline.terminal.Attributes.LocalFlag.ISIG, true);
            a.setControlChar(org.jline.terminal.Attributes.ControlChar.VINTR, 3);
            terminal.setAttributes(a);
        }
        if (a.getControlChar(org.jline.terminal.Attributes.ControlChar.VEOF) <= 0) {
            a.setControlChar(org.jline.terminal.Attributes.ControlChar.VEOF, 4);
            terminal.setAttributes(a);
        }
    }

    /** The history may hold queries over private data: only its owner may read it. */
    static void preparePrivateFile(Path f) {
        try {
            Path dir = f.toAbsolutePath().getParent();
            if (dir != null) Files.createDirectories(dir);
            if (!Files.exists(f)) Files.createFile(f);
            Files.setPosixFilePermissions(f, PosixFilePermissions.fromString("rw-------"));
        } catch (IOException | UnsupportedOperationException e) {
            // A shell without saved history still works; the user is not stopped for it.
        }
    }

    private void saveHistory(LineReader reader) {
        try {
            reader.getHistory().save();
        } catch (IOException ignored) {
            // see preparePrivateFile
        }
        historyFile.ifPresent(Shell::preparePrivateFile);
    }
}
