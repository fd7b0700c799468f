package dev.termgate.cli;

import dev.termgate.cli.shell.Shell;
import dev.termgate.cli.shell.ShellState;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.Translator;
import org.jline.terminal.Terminal;
import org.jline.terminal.TerminalBuilder;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.Callable;

/** {@code termgate shell}: questions and queries, one after another, with history and completion. */
@Command(name = "shell", mixinStandardHelpOptions = true,
        description = {"An interactive shell: type questions in plain language or queries; :help lists its commands.",
                "History is kept in $XDG_STATE_HOME/termgate/history (else ~/.local/state/termgate/history), readable only by you."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:left with Ctrl-D or :quit",
                "1:the ontology or graph could not be used",
                "2:usage error (bad option, missing API key)",
                "3:the graph server could not be reached",
                "4:internal error"})
public final class ShellCommand extends QuestionCommand implements Callable<Integer> {

    @Option(names = "--history", paramLabel = "FILE", description = "history file (default: see above)")
    Path history;

    @Option(names = "--no-history", description = "keep no history file")
    boolean noHistory;

    public ShellCommand() {
        this(AskWiring.standard());
    }

    ShellCommand(Pipeline.Factory factory) {
        super(factory);
    }

    @Override
    public Integer call() throws IOException {
        var settings = model.settings();
        var prompts = model.prompts();
        var limits = graph.limits();
        Pipeline pipeline = openPipeline(new java.io.PrintWriter(System.err, true));
        try (Terminal terminal = TerminalBuilder.builder().name("termgate").system(true).build()) {
            Translator translator = AskWiring.translator(settings, prompts, model.attempts, pipeline);
            ShellState.TranslatorMaker maker = spec -> {
                var s = model.settingsFor(spec);
                return s.spec().offline() ? dev.termgate.interpret.OfflineTranslator.forPipeline(pipeline)
                        : dev.termgate.translate.Translators.create(s, prompts, model.attempts, pipeline.schema());
            };
            Optional<Path> hist = noHistory ? Optional.empty() : Optional.of(history != null ? history : defaultHistory(model.env));
            new Shell(terminal, new ShellState(pipeline, translator, maker, model.attempts, limits), hist).run();
            return Exit.OK;
        } finally {
            AskWiring.closeQuietly(pipeline);
        }
    }

    static Path defaultHistory(Map<String, String> env) {
        String state = env.get("XDG_STATE_HOME");
        Path base = state != null && !state.isBlank() ? Path.of(state) : Path.of(System.getProperty("user.home"), ".local", "state");
        return base.resolve("termgate").resolve("history");
    }
}
