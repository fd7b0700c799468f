package dev.termgate.card;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

/** Runs Graphviz {@code dot} (an outside program, Debian package {@code graphviz}) to draw a DOT text. */
public final class Graphviz {

    /** Graphviz is not installed, or it failed on the input. */
    public static final class GraphvizException extends Exception {
        private final boolean missing;

        GraphvizException(String message, boolean missing) {
            super(message, null, false, false);
            this.missing = missing;
        }

        /** True when the {@code dot} program could not be started at all. */
        public boolean missing() {
            return missing;
        }
    }

    private static final long TIMEOUT_SECONDS = 60;

    private Graphviz() {}

    /** Whether {@code dot} can be started (it answers {@code dot -V}). */
    public static boolean available() {
        try {
            Process p = new ProcessBuilder("dot", "-V").redirectErrorStream(true).start();
            p.getInputStream().readAllBytes();
            return p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    /** The SVG drawing of a DOT text. */
    public static String toSvg(String dot) throws GraphvizException {
        Path in = null;
        Path errors = null;
        try {
            // Files rather than pipes for input and errors: only one stream is read, so nothing can block.
            in = Files.createTempFile("termgate-card", ".dot");
            errors = Files.createTempFile("termgate-card", ".err");
            Files.writeString(in, dot, StandardCharsets.UTF_8);
            Process p;
            try {
                p = new ProcessBuilder("dot", "-Tsvg").redirectInput(in.toFile()).redirectError(errors.toFile()).start();
            } catch (IOException e) {
                throw new GraphvizException("Graphviz 'dot' is not installed or not on the PATH (Debian/Ubuntu: apt-get "
                        + "install graphviz); use --format dot to get the DOT text instead", true);
            }
            byte[] svg = p.getInputStream().readAllBytes();
            if (!p.waitFor(TIMEOUT_SECONDS, TimeUnit.SECONDS)) {
                p.destroyForcibly();
                throw new GraphvizException("Graphviz 'dot' did not finish within " + TIMEOUT_SECONDS + " s", false);
            }
            if (p.exitValue() != 0) {
                String why = Files.readString(errors, StandardCharsets.UTF_8).strip();
                throw new GraphvizException("Graphviz 'dot' failed (exit " + p.exitValue() + "): " + why, false);
            }
            return new String(svg, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new GraphvizException("cannot run Graphviz 'dot': " + e.getMessage(), false);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new GraphvizException("interrupted while Graphviz 'dot' was running", false);
        } finally {
            deleteQuietly(in);
            deleteQuietly(errors);
        }
    }

    private static void deleteQuietly(Path p) {
        if (p == null) return;
        try {
            Files.deleteIfExists(p);
        } catch (IOException ignored) {
            // a leftover temp file is harmless
        }
    }
}
