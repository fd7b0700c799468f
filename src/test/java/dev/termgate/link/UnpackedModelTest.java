package dev.termgate.link;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.Arrays;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The embedding model's files unpacked into the cache: the same bytes as in the jar, written once. */
class UnpackedModelTest {

    private static final ClassLoader LOADER = UnpackedModelTest.class.getClassLoader();
    private static final String MODEL = "all-minilm-l6-v2-q.onnx";

    @Test
    void theModelIsUnpackedOnceWithTheJarsBytes(@TempDir Path dir) throws Exception {
        Path model = UnpackedModel.model(LOADER, MODEL, Optional.of(dir)).orElseThrow();
        byte[] inJar;
        try (InputStream in = LOADER.getResourceAsStream(MODEL)) {
            inJar = in.readAllBytes();
        }
        assertArrayEquals(inJar, Files.readAllBytes(model));
        FileTime old = FileTime.fromMillis(0);
        Files.setLastModifiedTime(model, old);
        assertEquals(model, UnpackedModel.model(LOADER, MODEL, Optional.of(dir)).orElseThrow());
        assertEquals(old, Files.getLastModifiedTime(model), "rewritten although it was complete");
        try (var files = Files.list(dir)) {
            assertEquals(1, files.count(), "a temporary file was left behind");
        }
    }

    @Test
    void aTruncatedFileIsReplaced(@TempDir Path dir) throws Exception {
        Path model = UnpackedModel.model(LOADER, MODEL, Optional.of(dir)).orElseThrow();
        byte[] whole = Files.readAllBytes(model);
        Files.write(model, Arrays.copyOf(whole, 1000));
        UnpackedModel.model(LOADER, MODEL, Optional.of(dir)).orElseThrow();
        assertArrayEquals(whole, Files.readAllBytes(model));
    }

    @Test
    void noCacheOrNoSuchResourceMeansReadingFromTheJar(@TempDir Path dir) {
        assertTrue(UnpackedModel.model(LOADER, MODEL, Optional.empty()).isEmpty());
        assertTrue(UnpackedModel.model(LOADER, "no-such-model.onnx", Optional.of(dir)).isEmpty());
        assertTrue(UnpackedModel.model(LOADER, MODEL, Optional.of(Path.of("/dev/null/not-a-dir"))).isEmpty());
    }

    @Test
    void theRuntimeLibrariesForThisSystemAreUnpackedSideBySide(@TempDir Path dir) throws Exception {
        String folder = "ai/onnxruntime/native/" + UnpackedModel.platform().orElseThrow() + "/";
        Path libs = UnpackedModel.runtimeLibraries(LOADER, dir).orElseThrow();
        for (String lib : new String[] {System.mapLibraryName("onnxruntime"), System.mapLibraryName("onnxruntime4j_jni")}) {
            try (InputStream in = LOADER.getResourceAsStream(folder + lib)) {
                assertArrayEquals(in.readAllBytes(), Files.readAllBytes(libs.resolve(lib)), lib);
            }
        }
    }
}
