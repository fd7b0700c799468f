package dev.termgate.link;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermInfo;

import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;

/**
 * One embedding per term (its label, or its split local name, and the first sentence of its comment),
 * computed once per ontology and cached on disk, so only the first run over an ontology pays for them.
 * A cache that cannot be read or written is skipped silently apart from {@link #cacheNote()}: it only costs
 * time, never a result.
 */
final class TermVectors {

    /** Bump when the text recipe changes, so old cache files are not reused. */
    private static final int RECIPE = 1;
    private static final int MAGIC = 0x54474556; // "TGEV"
    private static final int MAX_COMMENT_CHARS = 200;

    private final float[][] vectors;
    private final boolean fromCache;
    private final long computeMillis;
    private final String cacheNote;

    private TermVectors(float[][] vectors, boolean fromCache, long computeMillis, String cacheNote) {
        this.vectors = vectors;
        this.fromCache = fromCache;
        this.computeMillis = computeMillis;
        this.cacheNote = cacheNote;
    }

    static TermVectors load(GraphSchema schema, List<TermRef> terms, String lang, Embedder embedder,
                            Optional<Path> cacheDir) {
        List<String> texts = new ArrayList<>(terms.size());
        for (TermRef t : terms) texts.add(text(info(schema, t), lang));
        String file = fileName(schema, terms, texts, lang, embedder);
        String note = null;
        if (cacheDir.isPresent()) {
            Path p = cacheDir.get().resolve(file);
            try {
                if (Files.isRegularFile(p)) {
                    float[][] cached = read(p, terms.size());
                    if (cached != null) return new TermVectors(cached, true, 0, null);
                }
            } catch (IOException | RuntimeException e) {
                note = "embedding cache " + p + " unreadable (" + e.getMessage() + "); recomputed";
            }
        }
        long t0 = System.nanoTime();
        float[][] vs = embedder.embedAll(texts).toArray(new float[0][]);
        long ms = (System.nanoTime() - t0) / 1_000_000;
        if (cacheDir.isPresent()) {
            try {
                write(cacheDir.get(), file, vs);
            } catch (IOException | RuntimeException e) {
                note = "embedding cache not written to " + cacheDir.get() + " (" + e.getMessage() + ")";
            }
        }
        return new TermVectors(vs, false, ms, note);
    }

    /** Cosine similarity of the (unit) question vector with every term, in term order. */
    double[] similarities(float[] question) {
        double[] out = new double[vectors.length];
        for (int i = 0; i < vectors.length; i++) out[i] = Vectors.dot(question, vectors[i]);
        return out;
    }

    boolean fromCache() {
        return fromCache;
    }

    /** Milliseconds spent embedding the terms (0 when read from the cache). */
    long computeMillis() {
        return computeMillis;
    }

    /** Why the cache was not used, or {@code null}. */
    String cacheNote() {
        return cacheNote;
    }

    static TermInfo info(GraphSchema schema, TermRef t) {
        return switch (t.kind()) {
            case LABEL -> schema.labels().get(t.name()).info();
            case RELATIONSHIP -> schema.relTypes().get(t.name()).info();
            case PROPERTY -> schema.properties().get(t.name()).info();
        };
    }

    /** The text embedded for a term: what it is called and the gist of what it means. */
    static String text(TermInfo info, String lang) {
        String name = info.label(lang).orElseGet(() -> String.join(" ", Text.words(info.localName())));
        String comment = info.comment(lang).map(TermVectors::firstSentence).orElse("");
        return comment.isEmpty() ? name : name + ": " + comment;
    }

    static String firstSentence(String comment) {
        String s = comment.replaceAll("<[^>]*>", " ")
                .replaceAll("\\[\\[([^\\]]*)]]", "$1")
                .replaceAll("\\[([^\\]]*)]\\([^)]*\\)", "$1")
                .replaceAll("\\s+", " ").trim();
        int dot = s.indexOf(". ");
        if (dot > 0) s = s.substring(0, dot + 1);
        return s.length() > MAX_COMMENT_CHARS ? s.substring(0, MAX_COMMENT_CHARS) : s;
    }

    private static String fileName(GraphSchema schema, List<TermRef> terms, List<String> texts, String lang,
                                   Embedder embedder) {
        try {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            md.update((embedder.id() + "|" + RECIPE + "|" + lang + "\n").getBytes(StandardCharsets.UTF_8));
            for (int i = 0; i < terms.size(); i++) {
                md.update((terms.get(i).kind() + "|" + terms.get(i).name() + "|" + texts.get(i) + "\n")
                        .getBytes(StandardCharsets.UTF_8));
            }
            String texts16 = HexFormat.of().formatHex(md.digest()).substring(0, 16);
            String source = schema.sourceHash().replaceAll("[^A-Za-z0-9]", "");
            String source16 = source.isEmpty() ? "nosource" : source.substring(0, Math.min(16, source.length()));
            return "terms-" + embedder.id() + "-" + source16 + "-" + texts16 + ".vec";
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is always available", e);
        }
    }

    private static float[][] read(Path p, int count) throws IOException {
        ByteBuffer b = ByteBuffer.wrap(Files.readAllBytes(p));
        if (b.remaining() < 12 || b.getInt() != MAGIC) return null;
        int n = b.getInt();
        int dim = b.getInt();
        if (n != count || dim <= 0 || b.remaining() != (long) n * dim * Float.BYTES) return null;
        float[][] out = new float[n][dim];
        var fb = b.asFloatBuffer();
        for (float[] v : out) fb.get(v);
        return out;
    }

    private static void write(Path dir, String file, float[][] vs) throws IOException {
        Files.createDirectories(dir);
        int dim = vs.length == 0 ? 1 : vs[0].length;
        ByteArrayOutputStream bytes = new ByteArrayOutputStream(12 + vs.length * dim * Float.BYTES);
        try (DataOutputStream out = new DataOutputStream(bytes)) {
            out.writeInt(MAGIC);
            out.writeInt(vs.length);
            out.writeInt(dim);
            for (float[] v : vs) {
                for (float x : v) out.writeFloat(x);
            }
        }
        // Write then rename, so a concurrent reader never sees half a file.
        Path tmp = Files.createTempFile(dir, file, ".tmp");
        try {
            Files.write(tmp, bytes.toByteArray());
            Files.move(tmp, dir.resolve(file), StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }
}
