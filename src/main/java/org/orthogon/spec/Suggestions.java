package org.orthogon.spec;

import java.util.Collection;

/** "Did you mean" hints for misspelt keys and names, by Levenshtein distance (Levenshtein 1966). */
public final class Suggestions {
    private Suggestions() {
    }

    /**
     * " (did you mean \"x\"?)" for the closest candidate within a distance of a third of the
     * typed length (at least 2), otherwise the empty string.
     */
    public static String didYouMean(String typed, Collection<String> candidates) {
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String candidate : candidates) {
            int distance = distance(typed.toLowerCase(), candidate.toLowerCase());
            if (distance < bestDistance) {
                bestDistance = distance;
                best = candidate;
            }
        }
        int allowed = Math.max(2, typed.length() / 3);
        return best != null && bestDistance <= allowed ? " (did you mean \"" + best + "\"?)" : "";
    }

    /** Levenshtein edit distance: insertions, deletions and substitutions each cost 1. */
    public static int distance(String a, String b) {
        int[] previous = new int[b.length() + 1];
        int[] current = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            previous[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            current[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                current[j] = Math.min(Math.min(current[j - 1] + 1, previous[j] + 1), previous[j - 1] + cost);
            }
            int[] swap = previous;
            previous = current;
            current = swap;
        }
        return previous[b.length()];
    }
}
