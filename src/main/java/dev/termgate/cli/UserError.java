package dev.termgate.cli;

/** A failure the user can act on: printed as its message alone, with its exit code, never as a stack trace. */
public final class UserError extends RuntimeException {
    private final int exitCode;

    public UserError(int exitCode, String message) {
        super(message, null, false, false);
        this.exitCode = exitCode;
    }

    public int exitCode() {
        return exitCode;
    }
}
