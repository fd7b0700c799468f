package dev.termgate.interpret;

import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.PipelineSpec;
import dev.termgate.translate.Reply;
import dev.termgate.translate.StandardPipeline;
import dev.termgate.translate.TranslationRequest;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The interpreter as the shipped commands use it: its instance values are read through the real gate and engine
 * (not handed over from the RDF reader, as the accuracy test does). A profile query the gate refuses would leave the
 * interpreter with the ontology alone, and a named carrier would silently drop out of the query.
 */
class OfflineThroughPipelineTest {

    @Test
    void instanceValuesReachTheInterpreterThroughTheShippedPipeline() throws Exception {
        GraphSchema schema = OntologyLoader.load(List.of()).schema();
        PipelineSpec spec = PipelineSpec.local(schema, java.util.List.of());
        try (Pipeline pipeline = new StandardPipeline().open(spec)) {
            // Demo question q002 (examples/maritime/questions.jsonl): the gold query filters on the carrier's name.
            Reply reply = OfflineTranslator.forPipeline(pipeline)
                    .translate(TranslationRequest.first("Which ships does Tessarine Lines operate?", ""));
            assertTrue(reply.text().contains("'Tessarine Lines'"), reply.text());
        }
    }
}
