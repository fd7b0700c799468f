package dev.termgate.cli;

import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * The launcher's class-data archive is trained by {@link ArchiveTraining}; a step that fails (a command renamed,
 * an option gone) would silently leave its classes out of the archive, or the whole archive with it. So every
 * step must succeed, on the bundled demo, without a model service, and leave no temporary files behind.
 */
class ArchiveTrainingTest {

    @Test
    void everyTrainingStepSucceedsAndLeavesNothingBehind() throws Exception {
        Path tmp = Path.of(System.getProperty("java.io.tmpdir"));
        long before = trainingDirs(tmp);
        assertEquals(0, ArchiveTraining.train(), "training steps that failed");
        assertEquals(before, trainingDirs(tmp), "temporary directories left in " + tmp);
    }

    private static long trainingDirs(Path tmp) throws Exception {
        try (Stream<Path> s = Files.list(tmp)) {
            return s.filter(p -> p.getFileName().toString().startsWith("termgate-archive-training")).count();
        }
    }
}
