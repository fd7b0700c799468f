package dev.termgate.link;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.TermKind;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Behaviour of the standard linker on small invented schemas. The expected rankings follow from the
 * definitions (a term named in the question, a path between named classes); they are "common practice"
 * expectations, not figures from an outside source.
 */
class StandardLinkerTest {

    private final GraphSchema logistics = MiniSchema.logistics();
    private final LinkOptions lexical = LinkOptions.defaults().withoutCache().withLanguage("en").lexicalOnly();

    private static List<String> names(Linking l) {
        return l.ranked().stream().map(LinkedTerm::name).toList();
    }

    private static LinkedTerm term(Linking l, String name) {
        return l.ranked().stream().filter(t -> t.name().equals(name)).findFirst()
                .orElseThrow(() -> new AssertionError(name + " not ranked: " + names(l)));
    }

    @Test
    void namedClassesAreJoinedRightAfterTheLaterOne() {
        Linking l = Linkers.standard(logistics, lexical).link("Which tankers called at ports in 2024?", logistics);
        List<String> ns = names(l);
        assertFalse(l.fallback());
        int port = ns.indexOf("Port");
        int tanker = ns.indexOf("Tanker");
        int later = Math.max(port, tanker);
        // Tanker ↑ Vessel -PERFORMED_BY- Voyage -CALLS_AT- Port: the connectors follow the later anchor.
        List<String> connectors = ns.subList(later + 1, later + 4);
        assertTrue(connectors.containsAll(List.of("PERFORMED_BY", "Voyage")), ns.toString());
        assertTrue(ns.indexOf("CALLS_AT") < ns.indexOf("departureDate") || !ns.contains("departureDate"));
        assertTrue(term(l, "Voyage").evidence().stream().anyMatch(e -> e.startsWith("connects ")), term(l, "Voyage").toString());
        assertTrue(term(l, "Tanker").evidence().get(0).contains("\"tankers\""));
    }

    @Test
    void aPropertyOfANamedClassRanksHigh() {
        Linking l = Linkers.standard(logistics, lexical).link("List the vessels and their deadweight", logistics);
        assertEquals(java.util.Set.of("Vessel", "deadweight"), java.util.Set.copyOf(names(l).subList(0, 2)));
        assertEquals(TermKind.PROPERTY, term(l, "deadweight").kind());
        assertTrue(term(l, "deadweight").evidence().contains("property of Vessel"));
    }

    @Test
    void nothingRecognisedFallsBackToTheCentralPart() {
        Linking l = Linkers.standard(logistics, lexical).link("Tell me something nice", logistics);
        assertTrue(l.fallback());
        assertTrue(l.notices().get(0).contains("most central part"), l.notices().toString());
        assertEquals(TermKind.LABEL, l.ranked().get(0).kind());
        assertTrue(l.ranked().get(0).evidence().get(0).startsWith("central class"));
    }

    @Test
    void anOntologyWithoutLabelsIsMatchedOnLocalNames() {
        GraphSchema bare = MiniSchema.create().noAnnotations()
                .label("CargoVessel", null).label("HarbourMaster", null)
                .rel("supervises", "HarbourMaster", "CargoVessel", null)
                .build("bare");
        Linking l = Linkers.standard(bare, lexical).link("Which harbour masters supervise cargo vessels?", bare);
        assertTrue(names(l).subList(0, 3).containsAll(List.of("CargoVessel", "HarbourMaster", "SUPERVISES")), names(l).toString());
        assertTrue(term(l, "CargoVessel").evidence().get(0).startsWith("name \"CargoVessel\""));
    }

    @Test
    void labelsInTheQuestionsLanguageArePreferred() {
        GraphSchema s = MiniSchema.create()
                .labelWith("Ship", List.of(new LangString("ship", "en"), new LangString("Schiff", "de"),
                        new LangString("navire", "fr")), List.of())
                .labelWith("Harbour", List.of(new LangString("harbour", "en"), new LangString("Hafen", "de")), List.of())
                .build("langs");
        SchemaLinker auto = Linkers.standard(s, LinkOptions.defaults().withoutCache().lexicalOnly());
        Linking de = auto.link("Welche Schiffe gibt es?", s);
        assertEquals("Ship", de.ranked().get(0).name());
        assertTrue(de.ranked().get(0).evidence().get(0).contains("@de"), de.ranked().get(0).toString());
        // A French label never matches a German question.
        assertTrue(auto.link("Welche navire gibt es?", s).fallback());
    }

    @Test
    void aTypoStillFindsTheTerm() {
        Linking l = Linkers.standard(logistics, lexical).link("which vessles have the largest deadweight", logistics);
        assertTrue(names(l).subList(0, 2).contains("Vessel"), names(l).toString());
        assertTrue(term(l, "Vessel").evidence().get(0).contains("typo"), term(l, "Vessel").toString());
    }

    @Test
    void aMentionedValuePointsAtItsClass() {
        ValueIndex values = ValueIndex.builder().add("Orvane Shipping", "Company", "name").build();
        Linking l = Linkers.standard(logistics, lexical.withValues(values))
                .link("Which tankers does Orvane Shipping run?", logistics);
        LinkedTerm company = term(l, "Company");
        assertTrue(company.evidence().contains("value \"Orvane Shipping\" is a Company"), company.toString());
        // The company is joined to the tanker through OPERATED_BY.
        assertTrue(names(l).contains("OPERATED_BY"));
    }

    @Test
    void concurrentQuestionsGiveTheSameRankings() throws Exception {
        SchemaLinker linker = Linkers.standard(logistics, lexical);
        List<String> qs = List.of("Which tankers called at ports?", "vessels of each company", "ports per country",
                "voyages in 2024 and their vessels");
        List<Linking> sequential = new ArrayList<>();
        for (String q : qs) sequential.add(linker.link(q, logistics));
        ExecutorService pool = Executors.newFixedThreadPool(4);
        try {
            List<Future<Linking>> fs = new ArrayList<>();
            for (int rep = 0; rep < 5; rep++) for (String q : qs) fs.add(pool.submit(() -> linker.link(q, logistics)));
            for (int i = 0; i < fs.size(); i++) assertEquals(sequential.get(i % qs.size()), fs.get(i).get());
        } finally {
            pool.shutdown();
        }
    }

    @Test
    void embeddingsAreCachedAndALongQuestionIsTruncated(@TempDir Path dir) throws Exception {
        LinkOptions semantic = LinkOptions.defaults().withLanguage("en").withCacheDir(dir);
        StandardLinker first = new StandardLinker(logistics, semantic);
        assertFalse(first.vectors("en").fromCache());
        try (var files = Files.list(dir)) {
            assertEquals(1, files.filter(p -> p.toString().endsWith(".vec")).count());
        }
        StandardLinker second = new StandardLinker(logistics, semantic);
        assertTrue(second.vectors("en").fromCache(), "the second linker reads the vectors written by the first");

        String longQuestion = "Which ships carry oil " + "and then some more words ".repeat(40);
        Linking l = second.link(longQuestion, logistics);
        assertTrue(l.notices().stream().anyMatch(n -> n.contains("first " + StandardLinker.MAX_EMBED_WORDS + " words")),
                l.notices().toString());
        // "ships carry oil" means a tanker although no name says so.
        assertTrue(names(second.link("ships that carry oil", logistics)).subList(0, 3).contains("Tanker"));
    }

    @Test
    void anUnwritableCacheOnlyCostsTime(@TempDir Path dir) throws Exception {
        Path notADirectory = Files.writeString(dir.resolve("file"), "x");
        StandardLinker l = new StandardLinker(logistics, LinkOptions.defaults().withLanguage("en").withCacheDir(notADirectory));
        Linking linking = l.link("Which tankers called at ports?", logistics);
        assertFalse(linking.ranked().isEmpty());
        assertTrue(linking.notices().stream().anyMatch(n -> n.startsWith("embedding cache not written")), linking.notices().toString());
    }

    /** Runs without a letter are values, not meanings: the linker does not spend a model inference on them. */
    @Test
    void phrasesWithoutALetterAreNotEmbedded() {
        for (String value : List.of("17", "2024-05-01", "12:30", "#4711", "3.5")) {
            org.junit.jupiter.api.Assertions.assertFalse(StandardLinker.worthEmbedding(value), value);
        }
        for (String words : List.of("Valdoria last", "Ostrava", "berth 7", "Ørsund", "港口")) {
            org.junit.jupiter.api.Assertions.assertTrue(StandardLinker.worthEmbedding(words), words);
        }
    }
}
