package org.orthogon.data;

import java.util.List;
import java.util.Locale;

/** Shared lookup of enum constants by their model-file word. */
final class Ids {
    private Ids() {
    }

    static <E extends Enum<E>> E lookup(E[] values, String id, String key, List<String> words) {
        String wanted = id == null ? "" : id.strip().toLowerCase(Locale.ROOT);
        for (int i = 0; i < values.length; i++) {
            if (words.get(i).equals(wanted)) {
                return values[i];
            }
        }
        String hint = Suggestions.closest(wanted, words).map(s -> "did you mean \"" + s + "\"? ").orElse("");
        throw InputException.general().problem(
                "\"" + id + "\" is not a known value for " + key,
                hint + "write one of: " + String.join(", ", words));
    }
}
