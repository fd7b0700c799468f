package dev.termgate.link;

/** Bounded edit distance for typo tolerance. */
final class Fuzzy {
    private Fuzzy() {}

    /**
     * Optimal-string-alignment distance (insertions, deletions, substitutions and adjacent transpositions —
     * the usual typing slips), or {@code max + 1} as soon as it must exceed {@code max}.
     */
    static int distance(String a, String b, int max) {
        int n = a.length();
        int m = b.length();
        if (Math.abs(n - m) > max) return max + 1;
        int[] prev2 = new int[m + 1];
        int[] prev = new int[m + 1];
        int[] cur = new int[m + 1];
        for (int j = 0; j <= m; j++) prev[j] = j;
        for (int i = 1; i <= n; i++) {
            cur[0] = i;
            int rowMin = cur[0];
            for (int j = 1; j <= m; j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                int v = Math.min(Math.min(prev[j] + 1, cur[j - 1] + 1), prev[j - 1] + cost);
                if (i > 1 && j > 1 && a.charAt(i - 1) == b.charAt(j - 2) && a.charAt(i - 2) == b.charAt(j - 1)) {
                    v = Math.min(v, prev2[j - 2] + 1);
                }
                cur[j] = v;
                rowMin = Math.min(rowMin, v);
            }
            if (rowMin > max) return max + 1;
            int[] t = prev2;
            prev2 = prev;
            prev = cur;
            cur = t;
        }
        return Math.min(prev[m], max + 1);
    }
}
