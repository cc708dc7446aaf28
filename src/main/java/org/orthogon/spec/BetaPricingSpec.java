package org.orthogon.spec;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.orthogon.data.SeriesTable;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.moments.BetaPricingErrors;
import org.orthogon.moments.BetaPricingErrors.CrossSection;
import org.orthogon.moments.Payoff;
import org.orthogon.twopass.FactorSample;

/**
 * {@code family = "beta-pricing"}: the time-series regressions and the cross section of mean excess
 * returns on betas as one GMM system, E[R^e] = β λ (Cochrane 2005, "Asset Pricing", revised edition,
 * sections 12.2 and 13.3), estimated with the fixed selection of {@link BetaPricingErrors}: λ and the
 * pricing errors are the two-pass (Fama-MacBeth) estimates, their standard errors the GMM ones, which
 * carry the estimation of β and, with a kernel, serial correlation.
 *
 * <p>Its S is singular by construction, so only one-step GMM with the family's selection applies (the
 * default here); two-step, iterated and continuously-updated GMM are refused when the model file is
 * read, as are the keys that have no meaning for a closed-form, SDF-free system: instruments, start
 * values, bounds, an initial weight and the Hansen-Jagannathan simulation settings.
 *
 * @param factorColumns the factors, columns of the [data] factors file
 * @param crossSection  OLS (X') or GLS (X'Σ^{-1}) weighting of the pricing moments
 * @param intercept     whether the cross section has a common intercept lambda_0
 * @param common        the keys every family reads (only family itself may be used here)
 */
public record BetaPricingSpec(List<String> factorColumns, CrossSection crossSection, boolean intercept,
        ModelCommon common) implements ModelSpec {
    public static final Family FAMILY = new Family("beta-pricing",
            "E[R^e] = beta lambda: time series and cross section in one GMM system",
            List.of("factor_columns", "cross_section", "cross_section_intercept"), List.of(), BetaPricingSpec::read);

    private static final String SINGULAR_S = "its long-run covariance S is singular by construction (at the "
            + "estimate the pricing moments' deviations are beta (f_t - mean f) + eps_t, which add only K directions "
            + "to the N(K + 1) time-series moments, so N - K directions of S are null), so the weight S^-1 that "
            + "two-step, iterated and continuously-updated GMM need does not exist";
    private static final String USE_ONE_STEP = "use one-step GMM (method = \"one-step\" or --method one-step; "
            + "the family's default when no method is named), which estimates with the fixed selection of "
            + "cross_section (\"ols\" or \"gls\"), whose standard errors use S but never its "
            + "inverse; for efficient GMM on the same factors use family = \"linear-factor\" with form = \"demeaned\"";

    public BetaPricingSpec {
        factorColumns = List.copyOf(factorColumns);
    }

    private static BetaPricingSpec read(ModelSection model, ModelCommon common) {
        List<String> factors = model.stringList("factor_columns");
        if (factors.isEmpty()) {
            throw model.error("factor_columns", "the beta-pricing family needs factors",
                    "add factor_columns = [\"MKT\"] under [model], naming columns of the factors file");
        }
        for (String key : List.of("instrument_columns", "start_values", "bounds")) {
            if (model.has(key)) {
                throw model.error(key, key + " is not used by the beta-pricing family: " + (key.startsWith("instrument")
                        ? "its selection of moments is written for the unscaled time-series and pricing moments"
                        : "its estimates are closed-form regressions, with no search to start or bound"),
                        "remove " + key + (key.startsWith("instrument") ? "; for a conditional model use family = "
                                + "\"linear-factor\" with factor_instruments" : ""));
            }
        }
        List<String> ids = Arrays.stream(CrossSection.values()).map(CrossSection::id).toList();
        CrossSection crossSection = CrossSection.valueOf(model.choice("cross_section", ids, "ols")
                .toUpperCase(java.util.Locale.ROOT));
        boolean intercept = model.bool("cross_section_intercept", false);
        if (intercept && factors.contains("0")) {
            throw model.error("factor_columns", "a factor named \"0\" would share the name lambda_0 with the "
                    + "cross-sectional intercept", "rename the factor column, or set cross_section_intercept = false");
        }
        return new BetaPricingSpec(factors, crossSection, intercept, common);
    }

    @Override
    public Family family() {
        return FAMILY;
    }

    @Override
    public Payoff payoff() {
        return Payoff.EXCESS;
    }

    @Override
    public EstimationMethod defaultMethod() {
        return EstimationMethod.ONE_STEP;
    }

    @Override
    public Optional<Refusal> refusal(EstimationMethod method) {
        return method == EstimationMethod.ONE_STEP ? Optional.empty()
                : Optional.of(new Refusal(SINGULAR_S, USE_ONE_STEP));
    }

    @Override
    public Optional<Refusal> estimationKeyRefusal(String key) {
        return switch (key) {
            case "initial_weight" -> Optional.of(new Refusal("the family combines its moments with the fixed "
                    + "selection that cross_section chooses, so no weight is used", "remove initial_weight; choose "
                    + "the cross-sectional weighting with cross_section = \"ols\" or \"gls\" under [model]"));
            case "hj_seed", "hj_draws" -> Optional.of(new Refusal("the system prices no payoff with a stochastic "
                    + "discount factor, so it has no Hansen-Jagannathan distance to simulate", "remove " + key));
            default -> Optional.empty();
        };
    }

    /** The number of cross-sectional coefficients: one per factor, plus the intercept. */
    public int crossSectionCoefficients() {
        return factorColumns.size() + (intercept ? 1 : 0);
    }

    @Override
    public FamilyModel assemble(DataLoader data) {
        SeriesTable assets = data.excessReturns("the beta-pricing family prices excess returns");
        SeriesTable factors = data.factors(factorColumns);
        int n = assets.columnNames().size();
        int q = crossSectionCoefficients();
        if (n <= q) {
            throw data.missingKey("model", "factor_columns", "the cross section has " + n + " test asset"
                    + (n == 1 ? "" : "s") + " for " + factorColumns.size() + " factor" + (factorColumns.size() == 1
                            ? "" : "s") + (intercept ? " and an intercept" : "") + ", so no pricing restriction is "
                    + "left to test", "use at least " + (q + 1) + " test assets, or fewer factors");
        }
        DataLoader.Aligned aligned = data.align(assets, List.of(factors));
        double[][] factorRows = DataLoader.transpose(aligned.otherColumns(0));
        BetaPricingErrors errors = new BetaPricingErrors(aligned.assetRows(), factorRows, assets.columnNames(),
                factorColumns, crossSection, intercept);
        return new FamilyModel(errors, aligned, Map.of(),
                Optional.of(new FactorSample(assets.columnNames(), factorColumns, aligned.assetRows(), factorRows)));
    }
}
