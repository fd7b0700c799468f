package dev.termgate.ontology;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.SchemaJson;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Optional;

/**
 * Derived schemas on disk, one JSON file per content hash. Never fails the load: an unreadable, corrupted or
 * stale file is ignored (and replaced on the next write), and an unwritable directory just means no caching.
 */
final class SchemaCache {
    private final Path dir;

    SchemaCache(Path dir) {
        this.dir = dir;
    }

    Path fileFor(String hash) {
        return dir.resolve("schema-" + hash + ".json");
    }

    Optional<GraphSchema> read(String hash) {
        Path f = fileFor(hash);
        if (!Files.isRegularFile(f)) return Optional.empty();
        try {
            GraphSchema s = SchemaJson.fromJson(Files.readString(f, StandardCharsets.UTF_8));
            return s.sourceHash().equals(hash) ? Optional.of(s) : Optional.empty();
        } catch (IOException | IllegalArgumentException | java.io.UncheckedIOException e) {
            return Optional.empty();
        }
    }

    void write(String hash, GraphSchema schema) {
        try {
            Files.createDirectories(dir);
            Path tmp = Files.createTempFile(dir, "schema-", ".tmp");
            try {
                Files.writeString(tmp, SchemaJson.toCompactJson(schema), StandardCharsets.UTF_8);
                // Atomic so a concurrent reader never sees half a file.
                Files.move(tmp, fileFor(hash), StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
            } finally {
                Files.deleteIfExists(tmp);
            }
        } catch (IOException | RuntimeException e) {
            // The cache is an optimisation only.
        }
    }
}
