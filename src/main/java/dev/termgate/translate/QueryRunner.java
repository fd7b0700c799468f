package dev.termgate.translate;

/** Runs a checked, valid query on a graph (embedded or remote) within limits. */
public interface QueryRunner {

    /**
     * @param checked a verdict with {@code valid} true; anything else is refused
     * @throws InterruptedException when the run was cancelled (Ctrl-C in the shell)
     */
    RunResult run(Checked checked, RunLimits limits) throws InterruptedException;
}
