package dev.termgate.translate;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class PromptsTest {

    @Test
    void builtInTemplatesComeFromTheJarAndFillTheirSlots() {
        Prompts p = Prompts.builtIn();
        String system = p.fill(Prompts.SYSTEM, Map.of("card", "CARD-TEXT", "examples", "EXAMPLES"));
        assertTrue(system.contains("CARD-TEXT") && system.contains("EXAMPLES"), system);
        assertTrue(p.fill(Prompts.ASK, Map.of("question", "Q?")).contains("Question: Q?"));
    }

    @Test
    void slotValuesAreNotExpandedAgain() {
        String filled = Prompts.builtIn().fill(Prompts.ASK, Map.of("question", "show {{card}} and $1 \\"));
        assertTrue(filled.contains("show {{card}} and $1 \\"), filled);
    }

    @Test
    void aUserDirectoryReplacesSomeTemplates(@TempDir Path dir) throws Exception {
        Files.writeString(dir.resolve("ask.txt"), "Q>> {{question}}");
        Prompts p = Prompts.load(Optional.of(dir));
        assertEquals("Q>> hi", p.fill(Prompts.ASK, Map.of("question", "hi")));
        assertTrue(p.raw(Prompts.SYSTEM).contains("{{card}}"), "the others stay built in");
    }

    @Test
    void anUnknownSlotIsRefused(@TempDir Path dir) throws Exception {
        Files.writeString(dir.resolve("reask.txt"), "{{question}} {{secret_sauce}}");
        var e = assertThrows(IllegalArgumentException.class, () -> Prompts.load(Optional.of(dir)));
        assertTrue(e.getMessage().contains("{{secret_sauce}}"), e.getMessage());
    }
}
