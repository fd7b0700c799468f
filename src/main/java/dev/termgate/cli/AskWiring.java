package dev.termgate.cli;

import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.ModelSettings;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.translate.Prompts;
import dev.termgate.translate.ServiceFailure;
import dev.termgate.translate.StandardPipeline;
import dev.termgate.translate.Translator;
import dev.termgate.translate.Translators;

/** Opens what ask, shell and batch share, turning each failure into the documented exit code. */
final class AskWiring {

    private AskWiring() {}

    static Pipeline.Factory standard() {
        return new StandardPipeline();
    }

    static Pipeline open(Pipeline.Factory factory, PipelineSpec spec) {
        try {
            return factory.open(spec);
        } catch (Pipeline.PipelineException e) {
            int code = e.invalidInput() ? Exit.INVALID : e.serviceFailed() ? Exit.SERVICE : Exit.USAGE;
            throw new UserError(code, e.getMessage());
        }
    }

    /**
     * Rehearsals per start: enough that the quick compiler has compiled the request and reply JSON code before
     * the first real reply (one left the first quarter of a 200-question batch at 270-276 ms per call, forty at
     * 248-264 ms; BatchThroughputBench). Each costs a few milliseconds of a spare core while the graph loads.
     */
    static final int REHEARSALS = 40;

    /**
     * Rehearses the model client on a spare thread (see {@link dev.termgate.translate.ModelTranslator#rehearse}),
     * so that it is ready when the pipeline is; nothing for the offline interpreter. A failure here is left to
     * the real translator to report.
     */
    static void rehearseInBackground(ModelSettings settings, Prompts prompts) {
        if (settings.spec().offline()) return;
        Thread t = new Thread(() -> {
            try {
                dev.termgate.translate.ModelTranslator.rehearse(settings, prompts, REHEARSALS);
            } catch (RuntimeException ignored) {
                // told by the translator made for the real questions
            }
        }, "termgate-rehearsal");
        t.setDaemon(true);
        t.start();
    }

    static Translator translator(ModelSettings settings, Prompts prompts, int attempts, Pipeline pipeline) {
        // --model offline and no --model: the built-in interpreter, profiling the pipeline's graph.
        if (settings.spec().offline()) return dev.termgate.interpret.OfflineTranslator.forPipeline(pipeline);
        return translator(settings, prompts, attempts, pipeline.schema());
    }

    static Translator translator(ModelSettings settings, Prompts prompts, int attempts, GraphSchema schema) {
        try {
            return Translators.create(settings, prompts, attempts, schema);
        } catch (IllegalArgumentException e) {
            throw new UserError(Exit.USAGE, e.getMessage());
        }
    }

    static UserError failed(ServiceFailure f) {
        String what = switch (f.kind()) {
            case AUTHENTICATION -> "the model provider refused the API key: ";
            case MODEL_NOT_FOUND -> "the model provider rejected the model name: ";
            default -> "the model service failed: ";
        };
        return new UserError(Exit.SERVICE, what + f.getMessage());
    }

    static void closeQuietly(AutoCloseable c) {
        try {
            c.close();
        } catch (Exception ignored) {
            // closing at exit: nothing left to tell the user
        }
    }
}
