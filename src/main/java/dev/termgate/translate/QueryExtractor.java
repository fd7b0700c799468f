package dev.termgate.translate;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Finds the query candidates in a model's reply, most likely first: fenced blocks (with or without a language
 * tag), then runs of lines that start with a clause keyword, then the whole reply when it starts with one.
 * The loop takes the first candidate that parses. Prose without any clause keyword yields no candidate, so a
 * refusal or an apology is never mistaken for a query.
 */
public final class QueryExtractor {

    /** Longer candidates are not queries a person would review; the parser would refuse them anyway. */
    static final int MAX_CANDIDATE_CHARS = 20_000;
    /** At most this many candidates are tried; a reply listing dozens of fragments is not an answer. */
    static final int MAX_CANDIDATES = 8;

    private static final Pattern FENCE = Pattern.compile("(?m)^[ \\t]*(`{3,}|~{3,})[ \\t]*([\\w+-]*)[^\\n]*\\n(.*?)^[ \\t]*\\1[ \\t]*$",
            Pattern.DOTALL);
    private static final Set<String> CLAUSE_WORDS = Set.of("MATCH", "OPTIONAL", "WITH", "UNWIND", "RETURN", "CALL",
            "CREATE", "MERGE", "DELETE", "DETACH", "SET", "REMOVE", "FOREACH", "LOAD", "UNION", "WHERE", "ORDER",
            "SKIP", "LIMIT", "USE");
    /** The words a query can begin with (a candidate must start with one). */
    private static final Set<String> START_WORDS = Set.of("MATCH", "OPTIONAL", "WITH", "UNWIND", "RETURN", "CALL",
            "CREATE", "MERGE", "DELETE", "DETACH", "SET", "REMOVE", "FOREACH", "LOAD", "USE");

    private QueryExtractor() {}

    public static List<String> candidates(String reply) {
        if (reply == null || reply.isBlank()) return List.of();
        Set<String> found = new LinkedHashSet<>();
        Matcher m = FENCE.matcher(reply);
        while (m.find()) {
            String body = trimQuery(m.group(3));
            if (startsWithClause(body)) found.add(body);
        }
        // An unterminated fence (a reply cut off by a token limit) still holds a usable query.
        int open = reply.indexOf("```");
        if (found.isEmpty() && open >= 0) {
            int nl = reply.indexOf('\n', open);
            if (nl > 0) {
                String body = trimQuery(reply.substring(nl + 1).replace("```", ""));
                if (startsWithClause(body)) found.add(body);
            }
        }
        found.addAll(keywordRuns(reply));
        String whole = trimQuery(reply);
        if (startsWithClause(whole)) found.add(whole);
        List<String> out = new ArrayList<>();
        for (String c : found) {
            if (c.length() <= MAX_CANDIDATE_CHARS) out.add(c);
            if (out.size() == MAX_CANDIDATES) break;
        }
        return List.copyOf(out);
    }

    /** Runs of consecutive lines, the first starting with a clause keyword, ended by a blank or prose line. */
    private static List<String> keywordRuns(String reply) {
        List<String> runs = new ArrayList<>();
        StringBuilder run = null;
        for (String line : reply.split("\\R", -1)) {
            String t = stripInlineMarks(line.strip());
            if (run == null) {
                if (startsWithClause(t)) run = new StringBuilder(t);
            } else if (t.isEmpty() || t.startsWith("```") || t.startsWith("~~~") || looksLikeProse(t)) {
                runs.add(trimQuery(run.toString()));
                run = startsWithClause(t) ? new StringBuilder(t) : null;
            } else {
                run.append('\n').append(t);
            }
            if (run != null && run.length() > MAX_CANDIDATE_CHARS) {
                run = null;
            }
        }
        if (run != null) runs.add(trimQuery(run.toString()));
        return runs;
    }

    /** A line of prose: begins with a capitalised word that is not a clause keyword and ends a sentence. */
    private static boolean looksLikeProse(String line) {
        String first = firstWord(line);
        if (first.isEmpty() || CLAUSE_WORDS.contains(first.toUpperCase(Locale.ROOT))) return false;
        return Character.isUpperCase(first.charAt(0)) && first.length() > 1 && Character.isLowerCase(first.charAt(1))
                && line.split("\\s+").length >= 3 && !line.contains("(") && !line.contains("=");
    }

    private static String stripInlineMarks(String line) {
        if (line.length() >= 2 && line.startsWith("`") && line.endsWith("`") && !line.startsWith("```")) {
            return line.substring(1, line.length() - 1).strip();
        }
        return line;
    }

    /** True when the text begins with a word a query can begin with (MATCH, RETURN, …). */
    public static boolean startsWithClause(String text) {
        return START_WORDS.contains(firstWord(text).toUpperCase(Locale.ROOT));
    }

    private static String firstWord(String text) {
        int i = 0;
        while (i < text.length() && Character.isWhitespace(text.charAt(i))) i++;
        int j = i;
        while (j < text.length() && Character.isLetter(text.charAt(j))) j++;
        return text.substring(i, j);
    }

    /** Strips surrounding blank space and one trailing semicolon (statement terminator, not part of a query). */
    private static String trimQuery(String s) {
        String t = s.strip();
        while (t.endsWith(";")) t = t.substring(0, t.length() - 1).strip();
        return t;
    }
}
