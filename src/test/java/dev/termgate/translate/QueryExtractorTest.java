package dev.termgate.translate;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.List;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** Reply text → query candidates, best first (reply shapes are common practice of chat models, not from a source). */
class QueryExtractorTest {

    static Stream<Arguments> replies() {
        String q = "MATCH (v:Vessel) RETURN v.name";
        return Stream.of(
                Arguments.of("plain", q, List.of(q)),
                Arguments.of("plain with semicolon", q + ";", List.of(q)),
                Arguments.of("fence with tag", "```cypher\n" + q + "\n```", List.of(q)),
                Arguments.of("fence without tag", "```\n" + q + "\n```", List.of(q)),
                Arguments.of("tilde fence", "~~~\n" + q + "\n~~~", List.of(q)),
                Arguments.of("prose around a fence", "Here you go:\n\n```cypher\n" + q + "\n```\n\nThis lists them.", List.of(q)),
                Arguments.of("prose then bare query", "The query is:\n\n" + q + "\n\nIt lists the vessels.", List.of(q)),
                Arguments.of("multi-line bare query", "MATCH (v:Vessel)\nWHERE v.flag = 'NO'\nRETURN v.name",
                        List.of("MATCH (v:Vessel)\nWHERE v.flag = 'NO'\nRETURN v.name")),
                Arguments.of("two fences, both kept in order", "```cypher\nMATCH (a) RETURN a\n```\nor\n```cypher\n" + q + "\n```",
                        List.of("MATCH (a) RETURN a", q)),
                Arguments.of("unterminated fence", "```cypher\n" + q + "\n", List.of(q)),
                Arguments.of("inline backticks", "`" + q + "`", List.of(q)),
                Arguments.of("apology", "I'm sorry, I cannot answer that with the schema given.", List.of()),
                Arguments.of("empty", "", List.of()),
                Arguments.of("blank", "  \n\t ", List.of()),
                Arguments.of("fence holding prose only", "```\nno query here\n```", List.of()));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("replies")
    void candidates(String name, String reply, List<String> expected) {
        assertEquals(expected, QueryExtractor.candidates(reply));
    }
}
