package dev.termgate.cli;

import dev.termgate.translate.ToyPipeline;
import picocli.CommandLine;

import java.io.PrintWriter;

/**
 * {@code batch} with the stand-in pipeline, as its own process: the resume test kills it with SIGKILL. Same
 * command class and exit-code mapping as {@link Main}.
 */
public final class ToyBatchMain {
    public static void main(String[] args) {
        BatchCommand command = new BatchCommand(new ToyPipeline());
        CommandLine cl = new CommandLine(command);
        cl.setOut(new PrintWriter(System.out, true));
        cl.setErr(new PrintWriter(System.err, true));
        cl.setExecutionExceptionHandler((e, c, p) -> {
            if (e instanceof UserError u) {
                c.getErr().println("termgate: " + u.getMessage());
                return u.exitCode();
            }
            throw e;
        });
        command.model.env = CliRun.env();
        System.exit(cl.execute(args));
    }
}
