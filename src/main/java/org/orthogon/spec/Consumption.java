package org.orthogon.spec;

import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * Where the consumption-based families find consumption growth g_t = C_t/C_{t-1} in the [data] macro
 * file: a column of gross growth, or a column of levels (optionally per capita and deflated), never
 * both.
 *
 * @param growthColumn gross growth C_t/C_{t-1}
 * @param levelColumn  consumption levels, turned into growth
 * @param population   with levels: population, for per-capita growth
 * @param priceLevel   with levels: a price level, for real growth of nominal consumption
 */
public record Consumption(Optional<String> growthColumn, Optional<String> levelColumn, Optional<String> population,
        Optional<String> priceLevel) {
    /** The [model] keys this record reads. */
    static final List<String> KEYS = List.of("consumption_column", "consumption_level_column", "population_column",
            "price_column");

    /**
     * β &gt; 0, the bound every SDF with a time discount factor β keeps unless the model file says
     * otherwise: β^θ and β g^{-γ} are defined there.
     */
    static Map<String, double[]> discountFactorBounds() {
        return Map.of("beta", new double[] {0.0, Double.POSITIVE_INFINITY});
    }

    /** The growth series' name when it is built from levels. */
    static final String GROWTH_FROM_LEVELS = "cons_growth_from_levels";

    /** Whether growth is built from levels. */
    public boolean fromLevels() {
        return levelColumn.isPresent();
    }

    /** The name of the growth series the Euler equations use: the given column, or the one built from levels. */
    public String growthName() {
        return growthColumn.orElse(GROWTH_FROM_LEVELS);
    }

    /**
     * Reads and checks the consumption keys of {@code family}.
     *
     * @throws org.orthogon.data.InputException when both growth and levels are given, when population or
     *     price comes without levels, or when neither growth nor levels is given
     */
    static Consumption read(ModelSection model, String family) {
        Optional<String> growth = model.optionalString("consumption_column");
        Optional<String> levels = model.optionalString("consumption_level_column");
        Optional<String> population = model.optionalString("population_column");
        Optional<String> price = model.optionalString("price_column");
        if (growth.isPresent() && levels.isPresent()) {
            throw model.error("consumption_level_column",
                    "both consumption_column (growth) and consumption_level_column (levels) are given",
                    "keep one: growth C_t/C_{t-1} in consumption_column, or levels in consumption_level_column");
        }
        if (levels.isEmpty() && (population.isPresent() || price.isPresent())) {
            throw model.error(population.isPresent() ? "population_column" : "price_column",
                    "population_column and price_column apply to consumption levels, but no "
                            + "consumption_level_column is given", "add consumption_level_column = \"...\" under [model]");
        }
        if (growth.isEmpty() && levels.isEmpty()) {
            throw model.error("consumption_column", "the " + family + " family needs consumption growth",
                    "add consumption_column = \"cons_growth\" under [model] (gross growth C_t/C_{t-1}), or "
                            + "consumption_level_column for levels");
        }
        return new Consumption(growth, levels, population, price);
    }
}
