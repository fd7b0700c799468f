package dev.termgate.card;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.fail;

/**
 * Golden files under src/test/resources/golden/. A mismatch (or a missing file) writes {@code <name>_actual}
 * beside the expected file for review and fails; rename it over the expected file to accept it.
 */
final class Golden {

    static final Path DIR = Path.of("src", "test", "resources", "golden");

    private Golden() {}

    static void assertMatches(String name, String actual) throws IOException {
        Path expected = DIR.resolve(name);
        Path actualFile = DIR.resolve(name + "_actual");
        if (Files.exists(expected)) {
            String want = Files.readString(expected, StandardCharsets.UTF_8);
            if (want.equals(actual)) {
                Files.deleteIfExists(actualFile);
                return;
            }
        }
        Files.createDirectories(DIR);
        Files.writeString(actualFile, actual, StandardCharsets.UTF_8);
        fail((Files.exists(expected) ? "differs from golden file " : "no golden file ") + expected
                + "; wrote " + actualFile + " for review");
    }
}
