package dev.fray.core.plugin;

import java.util.Collection;

/** Did-you-mean suggestions by edit distance. */
public final class Suggest {
    private Suggest() {
    }

    /**
     * @param name       the unknown name
     * @param candidates known names
     * @return the candidate within edit distance max(2, |name|/3), closest first, or null
     */
    public static String closest(String name, Collection<String> candidates) {
        String best = null;
        int bestD = Math.max(2, name.length() / 3) + 1;
        for (String c : candidates) {
            int d = distance(name.toLowerCase(java.util.Locale.ROOT), c.toLowerCase(java.util.Locale.ROOT));
            if (d < bestD) {
                bestD = d;
                best = c;
            }
        }
        return best;
    }

    /** Levenshtein distance. */
    static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                cur[j] = Math.min(Math.min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + cost);
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}
