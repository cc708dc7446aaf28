package org.orthogon.data;

import java.util.Arrays;
import java.util.Locale;

/** What a return column measures; the model file's {@code returns_kind}. */
public enum ReturnKind {
    /** Payoff per unit invested, P_{t+1}/P_t plus dividends: around 1 in decimal. */
    GROSS,
    /** Gross minus one: around 0 in decimal. */
    NET,
    /** A return minus the risk-free rate of the same period: around 0 in decimal. */
    EXCESS;

    /** The model-file word: "gross", "net" or "excess". */
    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }

    /**
     * The kind named by a model-file word, ignoring case and surrounding spaces.
     *
     * @throws InputException for any other word, suggesting the closest one
     */
    public static ReturnKind fromId(String id) {
        return Ids.lookup(values(), id, "returns_kind",
                Arrays.stream(values()).map(ReturnKind::id).toList());
    }
}
