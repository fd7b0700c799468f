package dev.termgate.link;

import java.io.IOException;
import java.io.InputStream;
import java.net.JarURLConnection;
import java.net.URL;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Locale;
import java.util.Optional;
import java.util.jar.JarEntry;

/**
 * The embedding model's files, unpacked once into the cache instead of on every start. The model (23 MB) and the
 * ONNX runtime's native libraries (16 MB) ship compressed in their jars; inflating them took about 0.3 s and 0.15 s
 * of every process that embeds a question (measured on the CI machine), on the path of a batch's first cards.
 * Each unpacked file is named by its jar entry's CRC and size, so another version of an artifact gets its own
 * files and the jar is never read whole to find out. A file is written under a temporary name and renamed, so a
 * process running alongside never sees half of it. When anything here fails, the caller falls back to reading
 * from the jar, as the libraries do by themselves.
 */
final class UnpackedModel {

    /** The ONNX runtime reads the directory of its native libraries from this property, once, when it starts. */
    static final String RUNTIME_PATH_PROPERTY = "onnxruntime.native.path";

    private UnpackedModel() {}

    /** The model file, unpacked under {@code dir}; empty when it cannot be (then read it from the jar). */
    static Optional<Path> model(ClassLoader loader, String resource, Optional<Path> dir) {
        if (dir.isEmpty()) return Optional.empty();
        URL url = loader.getResource(resource);
        if (url == null) return Optional.empty();
        try {
            Optional<JarEntry> entry = entry(url);
            if (entry.isEmpty()) return Optional.empty();
            Path target = dir.get().resolve(key(entry.get()) + "-" + fileName(resource));
            unpack(url, target, entry.get().getSize());
            return Optional.of(target);
        } catch (IOException | RuntimeException e) {
            return Optional.empty();
        }
    }

    /**
     * Points the ONNX runtime at its native libraries unpacked under {@code dir}, unless the user already chose a
     * directory; call before the runtime's first use. Leaves the runtime's own unpacking in place when the
     * libraries for this system are not in the jar or cannot be written.
     */
    static void pointRuntimeAtUnpackedLibraries(ClassLoader loader, Optional<Path> dir) {
        if (dir.isEmpty() || System.getProperty(RUNTIME_PATH_PROPERTY) != null) return;
        runtimeLibraries(loader, dir.get()).ifPresent(libs -> System.setProperty(RUNTIME_PATH_PROPERTY, libs.toString()));
    }

    /**
     * The directory under {@code dir} that holds this system's runtime libraries, unpacked; empty when the jar has
     * none for this system or they cannot be written.
     */
    static Optional<Path> runtimeLibraries(ClassLoader loader, Path dir) {
        Optional<String> platform = platform();
        if (platform.isEmpty()) return Optional.empty();
        String folder = "ai/onnxruntime/native/" + platform.get() + "/";
        String runtime = System.mapLibraryName("onnxruntime");
        String bridge = System.mapLibraryName("onnxruntime4j_jni");
        URL runtimeUrl = loader.getResource(folder + runtime);
        URL bridgeUrl = loader.getResource(folder + bridge);
        if (runtimeUrl == null || bridgeUrl == null) return Optional.empty();
        try {
            Optional<JarEntry> runtimeEntry = entry(runtimeUrl);
            Optional<JarEntry> bridgeEntry = entry(bridgeUrl);
            if (runtimeEntry.isEmpty() || bridgeEntry.isEmpty()) return Optional.empty();
            // The runtime loads both libraries by their plain names from one directory: one directory per pair.
            Path libs = dir.resolve("onnxruntime-" + key(runtimeEntry.get()) + "-" + key(bridgeEntry.get()));
            unpack(runtimeUrl, libs.resolve(runtime), runtimeEntry.get().getSize());
            unpack(bridgeUrl, libs.resolve(bridge), bridgeEntry.get().getSize());
            return Optional.of(libs);
        } catch (IOException | RuntimeException e) {
            return Optional.empty(); // the runtime unpacks its libraries itself, as it does without a cache
        }
    }

    /** The runtime's name for this system's folder of libraries (os-arch), when it ships one. */
    static Optional<String> platform() {
        String os = System.getProperty("os.name", "").toLowerCase(Locale.ROOT);
        String arch = System.getProperty("os.arch", "").toLowerCase(Locale.ROOT);
        String o = os.contains("linux") ? "linux" : os.contains("mac") || os.contains("darwin") ? "osx"
                : os.contains("win") ? "win" : null;
        String a = arch.equals("amd64") || arch.equals("x86_64") ? "x64" : arch.equals("aarch64") ? "aarch64" : null;
        return o == null || a == null ? Optional.empty() : Optional.of(o + "-" + a);
    }

    private static Optional<JarEntry> entry(URL url) throws IOException {
        if (!(url.openConnection() instanceof JarURLConnection jar)) return Optional.empty();
        JarEntry e = jar.getJarEntry();
        return e == null || e.getCrc() < 0 || e.getSize() < 0 ? Optional.empty() : Optional.of(e);
    }

    private static String key(JarEntry e) {
        return Long.toHexString(e.getCrc()) + "-" + e.getSize();
    }

    private static String fileName(String resource) {
        return resource.substring(resource.lastIndexOf('/') + 1);
    }

    /** Copies the resource to {@code target} unless a file of the right size is already there. */
    private static void unpack(URL url, Path target, long size) throws IOException {
        if (Files.isRegularFile(target) && Files.size(target) == size) return;
        Files.createDirectories(target.getParent());
        Path tmp = Files.createTempFile(target.getParent(), target.getFileName().toString(), ".tmp");
        try {
            try (InputStream in = url.openStream()) {
                Files.copy(in, tmp, StandardCopyOption.REPLACE_EXISTING);
            }
            if (Files.size(tmp) != size) throw new IOException("short copy of " + url);
            Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }
}
