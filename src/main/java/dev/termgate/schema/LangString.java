package dev.termgate.schema;

/** A text with its language tag ({@code ""} when untagged). */
public record LangString(String text, String lang) {
    public LangString {
        java.util.Objects.requireNonNull(text);
        lang = lang == null ? "" : lang;
    }
}
