package dev.termgate.translate;

import dev.termgate.schema.GraphSchema;

/**
 * The parts a question passes through after the model: the schema, the card source, the gate and the runner,
 * opened once per command (or shell session) and closed at its end.
 */
public record Pipeline(GraphSchema schema, CardSource cards, QueryGate gate, QueryRunner runner, AutoCloseable resources)
        implements AutoCloseable {

    @Override
    public void close() throws Exception {
        resources.close();
    }

    /** How to open a pipeline; the standard one reads ontologies and graphs, tests give scripted ones. */
    public interface Factory {
        /**
         * @throws PipelineException when an input cannot be used (the message is for the user)
         */
        Pipeline open(PipelineSpec spec) throws PipelineException;
    }

    /** An input the pipeline needs cannot be used; {@code invalidInput} says whether it was read and found wrong. */
    public static final class PipelineException extends Exception {
        private final boolean invalidInput;
        private final boolean serviceFailed;

        public PipelineException(String message, boolean invalidInput, boolean serviceFailed) {
            super(message, null, false, false);
            this.invalidInput = invalidInput;
            this.serviceFailed = serviceFailed;
        }

        public boolean invalidInput() {
            return invalidInput;
        }

        public boolean serviceFailed() {
            return serviceFailed;
        }
    }
}
