package dev.termgate.engine;

/** Lets benchmarks outside the engine package compare the engine's shortcuts with the plain paths. */
public final class EngineSwitches {
    private EngineSwitches() {}

    /** A pushed projection, or the client-only path. */
    public static void pushdown(boolean on) {
        ProjectionPushdown.enabled = on;
    }

    /** A selective label's vertices looked up by id on the embedded graph, or every vertex's label tested. */
    public static void labelIndex(boolean on) {
        Matcher.labelIndex = on;
    }
}
