package org.orthogon.data;

import java.util.Collection;
import java.util.Locale;
import java.util.Optional;

/**
 * "Did you mean" for names a user typed: column names here, model-file keys elsewhere. A typo is
 * cheaper to fix when the message names the intended word than when it lists twenty candidates.
 */
public final class Suggestions {
    private Suggestions() {
    }

    /**
     * The candidate closest to {@code wanted} by Levenshtein edit distance, ignoring case, provided it
     * is close enough to be a plausible typo: at most 2 edits, or a third of the longer word's length.
     * Ties go to the candidate listed first, so the suggestion is deterministic.
     */
    public static Optional<String> closest(String wanted, Collection<String> candidates) {
        String target = wanted.toLowerCase(Locale.ROOT);
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String candidate : candidates) {
            int d = levenshtein(target, candidate.toLowerCase(Locale.ROOT));
            if (d < bestDistance) {
                best = candidate;
                bestDistance = d;
            }
        }
        if (best == null) {
            return Optional.empty();
        }
        int allowed = Math.max(2, Math.max(target.length(), best.length()) / 3);
        return bestDistance <= allowed ? Optional.of(best) : Optional.empty();
    }

    /**
     * The {@link #closest} candidate as a phrase to append to a fix, " (did you mean \"x\"?)", or the
     * empty string when nothing is close.
     */
    public static String didYouMean(String wanted, Collection<String> candidates) {
        return closest(wanted, candidates).map(s -> " (did you mean \"" + s + "\"?)").orElse("");
    }

    /** The number of single-character insertions, deletions and substitutions turning a into b. */
    public static int levenshtein(String a, String b) {
        int[] previous = new int[b.length() + 1];
        int[] current = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            previous[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            current[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int substitution = previous[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                current[j] = Math.min(substitution, Math.min(previous[j], current[j - 1]) + 1);
            }
            int[] swap = previous;
            previous = current;
            current = swap;
        }
        return previous[b.length()];
    }
}
