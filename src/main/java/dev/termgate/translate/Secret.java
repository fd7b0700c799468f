package dev.termgate.translate;

/** An API key. Its {@code toString} never shows it, so it cannot end up in a message, a log or a file by accident. */
public final class Secret {
    private final String value;

    public Secret(String value) {
        this.value = value;
    }

    /** The key itself: only for the request header. */
    public String reveal() {
        return value;
    }

    /** Removes the key from a text that may echo it (some providers quote part of a refused key). */
    public String redact(String text) {
        if (text == null) return "";
        String t = value.length() >= 4 ? text.replace(value, "[key]") : text;
        return t.replaceAll("\\b(sk|key|tok)-[A-Za-z0-9_*.-]{4,}", "[key]");
    }

    @Override
    public String toString() {
        return "[key]";
    }
}
