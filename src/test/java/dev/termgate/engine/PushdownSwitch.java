package dev.termgate.engine;

/** Lets benchmarks outside the engine package compare a pushed projection with the client-only path. */
public final class PushdownSwitch {
    private PushdownSwitch() {}

    public static void enable(boolean on) {
        ProjectionPushdown.enabled = on;
    }
}
