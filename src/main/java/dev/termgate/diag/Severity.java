package dev.termgate.diag;

public enum Severity {
    ERROR, WARNING, INFO;

    public String word() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}
