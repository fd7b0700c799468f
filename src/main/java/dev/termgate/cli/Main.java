package dev.termgate.cli;

import dev.termgate.Version;
import picocli.CommandLine;
import picocli.CommandLine.Command;

import java.io.PrintWriter;

/** The top command. Wiring only: each subcommand is its own class. */
@Command(name = "termgate",
        mixinStandardHelpOptions = true,
        versionProvider = Main.VersionProvider.class,
        description = "Ask a property graph questions in plain language, using only the terms its OWL/RDFS ontology defines.",
        subcommands = {CommandLine.HelpCommand.class, CardCommand.class, CheckCommand.class, AskCommand.class, ShellCommand.class, BatchCommand.class,
                EvalCommand.class, AuditCommand.class,
                RunCommand.class, ImportCommand.class},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:ok",
                "1:the input was checked and is invalid",
                "2:usage error",
                "3:an outside service failed (model, graph server, SPARQL endpoint)",
                "4:internal error (please report it)"})
public final class Main implements Runnable {

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    public static void main(String[] args) {
        System.setProperty("io.netty.noUnsafe", "true");
        int code = run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true));
        dev.termgate.translate.Translators.releaseAtExit();
        System.exit(code);
    }

    /** Runs a command line with the given streams; used by {@link #main} and by tests. */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cl = commandLine();
        cl.setOut(out);
        cl.setErr(err);
        return cl.execute(args);
    }

    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new Main());
        cl.setExecutionExceptionHandler(Main::onException);
        cl.setParameterExceptionHandler(Main::onBadUsage);
        return cl;
    }

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    private static int onBadUsage(CommandLine.ParameterException e, String[] args) {
        PrintWriter err = e.getCommandLine().getErr();
        err.println("termgate: " + e.getMessage());
        CommandLine.UnmatchedArgumentException.printSuggestions(e, err);
        err.println("Try '" + e.getCommandLine().getCommandSpec().qualifiedName() + " --help'.");
        return Exit.USAGE;
    }

    private static int onException(Exception e, CommandLine cl, CommandLine.ParseResult parsed) {
        PrintWriter err = cl.getErr();
        if (e instanceof UserError u) {
            err.println("termgate: " + u.getMessage());
            return u.exitCode();
        }
        err.println("termgate: internal error: " + e);
        if (System.getenv("TERMGATE_DEBUG") != null) {
            e.printStackTrace(err);
        } else {
            err.println("(set TERMGATE_DEBUG=1 to see the stack trace, and please report it)");
        }
        return Exit.INTERNAL;
    }

    static final class VersionProvider implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {"termgate " + Version.VALUE, "Java " + Runtime.version()};
        }
    }
}
