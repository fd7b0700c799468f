package dev.termgate.cli;

/** The documented exit codes of every command (README, "Exit codes"). */
public final class Exit {
    /** Everything went well. */
    public static final int OK = 0;
    /** The input was checked and found invalid (a query, an ontology, a question file). */
    public static final int INVALID = 1;
    /** The command line was wrong. */
    public static final int USAGE = 2;
    /** An outside service failed: a model provider, a remote graph server, a SPARQL endpoint. */
    public static final int SERVICE = 3;
    /** A bug in termgate. */
    public static final int INTERNAL = 4;

    private Exit() {}
}
