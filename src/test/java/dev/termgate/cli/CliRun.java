package dev.termgate.cli;

import picocli.CommandLine;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.Map;
import java.util.function.Consumer;

/** Runs one command object as {@link Main} would (same exit-code mapping), capturing what the user sees. */
public final class CliRun {

    public record Result(int code, String out, String err) {
        public String all() {
            return out + err;
        }
    }

    private CliRun() {}

    /** A test environment: no API key, no config file of the person running the tests. */
    public static Map<String, String> env() {
        return Map.of("TERMGATE_CONFIG", "/nonexistent/termgate-test-config.properties");
    }

    public static Result run(Object command, Consumer<Object> setUp, String... args) {
        CommandLine cl = new CommandLine(command);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        cl.setExecutionExceptionHandler((e, c, p) -> {
            if (e instanceof UserError u) {
                c.getErr().println("termgate: " + u.getMessage());
                return u.exitCode();
            }
            throw e;
        });
        cl.setParameterExceptionHandler((e, a) -> {
            e.getCommandLine().getErr().println("termgate: " + e.getMessage());
            return Exit.USAGE;
        });
        setUp.accept(command);
        int code = cl.execute(args);
        return new Result(code, out.toString(), err.toString());
    }

    /** Sets the environment of the command's model options (after picocli has made the mixin). */
    static Consumer<Object> withEnv(Map<String, String> env) {
        return c -> {
            if (c instanceof AskCommand a) a.model.env = env;
            if (c instanceof BatchCommand b) b.model.env = env;
            if (c instanceof ShellCommand s) s.model.env = env;
        };
    }
}
