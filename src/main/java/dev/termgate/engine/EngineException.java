package dev.termgate.engine;

import dev.termgate.diag.Code;

/**
 * A run that could not finish: the code says why (TIMEOUT, CANCELLED, RUNTIME_ERROR, REMOTE_UNAVAILABLE).
 * The message is the code's template filled in; no partial result travels with it.
 */
public final class EngineException extends RuntimeException {
    private final Code code;

    public EngineException(Code code, Object... args) {
        super(code.format(args), null, false, false);
        this.code = code;
    }

    EngineException(Code code, Throwable cause, Object... args) {
        super(code.format(args), cause, false, true);
        this.code = code;
    }

    public Code code() {
        return code;
    }

    /** True when an outside service (the remote graph server) failed, as opposed to the query itself. */
    public boolean isServiceFailure() {
        return code == Code.REMOTE_UNAVAILABLE;
    }

    static EngineException runtime(String message) {
        return new EngineException(Code.RUNTIME_ERROR, message);
    }
}
