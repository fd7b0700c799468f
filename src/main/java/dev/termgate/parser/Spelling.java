package dev.termgate.parser;

import dev.termgate.parser.antlr.CypherLexer;
import org.antlr.v4.runtime.Token;
import org.antlr.v4.runtime.Vocabulary;
import org.antlr.v4.runtime.misc.IntervalSet;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** "Did you mean MATCH?" for a misspelt keyword: the expected keywords closest to the offending word. */
final class Spelling {
    private Spelling() {}

    static List<String> closeKeywords(Token t, IntervalSet expected, Vocabulary vocabulary) {
        if (t == null || t.getType() != CypherLexer.Identifier || vocabulary == null || expected == null) return List.of();
        String word = t.getText().toUpperCase(Locale.ROOT);
        if (word.length() < 3) return List.of();
        List<String> out = new ArrayList<>();
        int best = Integer.MAX_VALUE;
        for (int type : expected.toList()) {
            if (type <= 0 || vocabulary.getLiteralName(type) != null) continue;
            String kw = vocabulary.getSymbolicName(type);
            if (kw == null || !kw.chars().allMatch(ch -> ch == '_' || Character.isUpperCase(ch))) continue;
            kw = kw.replace("_", "");
            int d = distance(word, kw);
            if (d > Math.max(1, kw.length() / 3)) continue;
            if (d < best) {
                out.clear();
                best = d;
            }
            if (d == best) out.add(kw);
        }
        return out;
    }

    /** Optimal string alignment distance (Levenshtein with transpositions). */
    static int distance(String a, String b) {
        int[][] d = new int[a.length() + 1][b.length() + 1];
        for (int i = 0; i <= a.length(); i++) d[i][0] = i;
        for (int j = 0; j <= b.length(); j++) d[0][j] = j;
        for (int i = 1; i <= a.length(); i++) {
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                d[i][j] = Math.min(Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1), d[i - 1][j - 1] + cost);
                if (i > 1 && j > 1 && a.charAt(i - 1) == b.charAt(j - 2) && a.charAt(i - 2) == b.charAt(j - 1)) {
                    d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
                }
            }
        }
        return d[a.length()][b.length()];
    }
}
