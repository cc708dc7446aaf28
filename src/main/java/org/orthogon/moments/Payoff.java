package org.orthogon.moments;

import java.util.Arrays;
import java.util.Locale;
import java.util.Optional;

/**
 * What the test assets' payoffs are, which fixes their price p in the pricing equation E[m x] = p
 * (Cochrane 2005, "Asset Pricing", revised edition, chapter 1): a gross return costs one unit, an
 * excess return (a zero-cost portfolio) nothing.
 */
public enum Payoff {
    /** Gross returns, price 1: E[m R] = 1. */
    GROSS(1.0),
    /** Excess returns, price 0: E[m R^e] = 0. */
    EXCESS(0.0);

    private final double price;

    Payoff(double price) {
        this.price = price;
    }

    /** The price p of one unit of this kind of payoff. */
    public double price() {
        return price;
    }

    /** The model-file word: "gross" or "excess". */
    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** What a reader calls one payoff of this kind: "gross return" or "excess return". */
    public String label() {
        return id() + " return";
    }

    /** The payoff named by a model-file word, or empty. */
    public static Optional<Payoff> fromId(String id) {
        return Arrays.stream(values()).filter(p -> p.id().equals(id)).findFirst();
    }
}
