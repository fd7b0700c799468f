package dev.termgate.cli;

import dev.termgate.translate.PipelineSpec;
import picocli.CommandLine.Option;

/** The token budget of the schema card a model is given; shared by the commands that ask a model. */
public final class BudgetOption {

    @Option(names = "--budget", paramLabel = "TOKENS", defaultValue = "" + PipelineSpec.DEFAULT_BUDGET,
            description = "token budget of the schema card (default: ${DEFAULT-VALUE})")
    int budget;

    /** The budget, checked. */
    int tokens() {
        if (budget < 50) throw new UserError(Exit.USAGE, "--budget must be at least 50 tokens");
        return budget;
    }
}
