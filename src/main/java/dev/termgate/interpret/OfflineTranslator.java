package dev.termgate.interpret;

import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.Checked;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.Reply;
import dev.termgate.translate.RunLimits;
import dev.termgate.translate.RunResult;
import dev.termgate.translate.TranslationRequest;
import dev.termgate.translate.Translator;

import java.util.function.Supplier;

/**
 * The offline interpreter behind translate's {@link Translator} interface: what {@code --model offline} and no
 * {@code --model} select. It reads the question, not the card (it knows the whole schema); a re-ask gets the
 * same answer, so the loop stops after repair. A question it does not understand is declined, which the loop
 * reports as NOT_UNDERSTOOD instead of running a guess.
 */
public final class OfflineTranslator implements Translator {

    public static final String NAME = "offline";

    private final Supplier<DataProfile> profile;
    private final GraphSchema schema;
    private volatile Interpreter interpreter;

    private OfflineTranslator(GraphSchema schema, Supplier<DataProfile> profile) {
        this.schema = schema;
        this.profile = profile;
    }

    /** @param profile read on the first question (so that opening a shell stays quick) */
    public static OfflineTranslator create(GraphSchema schema, Supplier<DataProfile> profile) {
        return new OfflineTranslator(schema, profile);
    }

    /**
     * The interpreter over a pipeline's schema, profiling the pipeline's own graph (through its gate and runner,
     * so it works the same embedded and remote). When the graph cannot be read that way, no data is known and
     * the interpreter still works from the ontology alone.
     */
    public static OfflineTranslator forPipeline(Pipeline pipeline) {
        return create(pipeline.schema(), () -> {
            try {
                return DataProfiles.byQueries(text -> rows(pipeline, text), pipeline.schema());
            } catch (RuntimeException e) {
                return DataProfile.empty();
            }
        });
    }

    private static java.util.List<java.util.List<Object>> rows(Pipeline pipeline, String text) {
        Checked c = pipeline.gate().check(text);
        if (!c.valid()) throw new IllegalStateException("profile query refused: " + c.report());
        try {
            RunResult r = pipeline.runner().run(c, new RunLimits(java.time.Duration.ofSeconds(60), Integer.MAX_VALUE));
            if (r.failed()) throw new IllegalStateException("profile query failed");
            return r.rows();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted");
        }
    }

    public Interpreter interpreter() {
        Interpreter i = interpreter;
        if (i == null) {
            synchronized (this) {
                i = interpreter;
                if (i == null) {
                    i = Interpreter.create(schema, profile.get());
                    interpreter = i;
                }
            }
        }
        return i;
    }

    @Override
    public String name() {
        return NAME;
    }

    @Override
    public boolean readsCard() {
        return false;
    }

    @Override
    public Reply translate(TranslationRequest request) {
        Interpretation it = interpreter().interpret(request.question());
        if (it.query().isEmpty()) return Reply.declined(it.notUnderstood().orElse("no reading found"));
        return Reply.of(it.query().get());
    }
}
