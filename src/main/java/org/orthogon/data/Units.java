package org.orthogon.data;

import java.util.Arrays;
import java.util.Locale;

/** How return-like numbers are written in a file; the model file's {@code units}. */
public enum Units {
    /** 0.0123 means 1.23 percent. */
    DECIMAL,
    /** 1.23 means 1.23 percent; divided by 100 on reading. */
    PERCENT;

    /** The model-file word: "decimal" or "percent". */
    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }

    /**
     * The units named by a model-file word, ignoring case and surrounding spaces.
     *
     * @throws InputException for any other word, suggesting the closest one
     */
    public static Units fromId(String id) {
        return Ids.lookup(values(), id, "units",
                Arrays.stream(values()).map(Units::id).toList());
    }
}
