package dev.termgate.graph;

/** Data that cannot be imported: the message names the file and, where known, the line. */
public final class ImportException extends RuntimeException {
    public ImportException(String message) {
        super(message, null, false, false);
    }

    public ImportException(String message, Throwable cause) {
        super(message, cause, false, false);
    }
}
