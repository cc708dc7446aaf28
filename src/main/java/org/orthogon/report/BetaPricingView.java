package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.spec.BetaPricingSpec;
import org.orthogon.spec.RunSpec;

/**
 * How a fit of the beta-pricing system is shown: the cross-sectional coefficients (λ_0, λ) in the main
 * parameter table, the N(K + 1) time-series parameters a and β in a table of their own with one row per
 * asset, and the N pricing errors α with their joint test. The time-series moments are zero at the
 * estimate by construction and are not listed.
 */
final class BetaPricingView {
    private final BetaPricingSpec model;
    private final GmmFit fit;
    private final int coefficients;
    private final int assets;

    private BetaPricingView(BetaPricingSpec model, GmmFit fit) {
        this.model = model;
        this.fit = fit;
        this.coefficients = model.crossSectionCoefficients();
        int factors = model.factorColumns().size();
        this.assets = (fit.parameters().size() - coefficients) / (factors + 1);
    }

    /** The view of a beta-pricing fit; empty for every other family. */
    static Optional<BetaPricingView> of(RunSpec spec, GmmFit fit) {
        return spec.model() instanceof BetaPricingSpec beta ? Optional.of(new BetaPricingView(beta, fit))
                : Optional.empty();
    }

    /** λ_0 (with the intercept) and λ: the rows of the main parameter table. */
    List<ParameterEstimate> headline() {
        return fit.parameters().subList(0, coefficients);
    }

    /** a_i, then β_i asset by asset. */
    List<ParameterEstimate> timeSeries() {
        return fit.parameters().subList(coefficients, fit.parameters().size());
    }

    /** The N pricing errors α_i = mean R^e_i - λ_0 - β_i'λ. */
    List<PricingError> pricingErrors() {
        return fit.pricingErrors().subList(0, assets);
    }

    /** The cross-sectional weighting, "ols" or "gls". */
    String crossSection() {
        return model.crossSection().id();
    }

    boolean intercept() {
        return model.intercept();
    }

    /** How many time-series moments the system holds, N(K + 1). */
    int timeSeriesMoments() {
        return fit.momentCount() - assets;
    }

    /** "beta-pricing system, OLS cross section without intercept", for headers. */
    String describe() {
        return "beta-pricing system, " + crossSection().toUpperCase(Locale.ROOT) + " cross section "
                + (intercept() ? "with" : "without") + " intercept";
    }

    /** The sentence that points from the main table to the time-series table. */
    String timeSeriesNote(String where) {
        return String.format(Locale.ROOT, "The %d time-series parameters (a and %d beta%s for each of the %d assets) "
                + "are %s; their moments are zero at the estimate by construction.", timeSeries().size(),
                model.factorColumns().size(), model.factorColumns().size() == 1 ? "" : "s", assets, where);
    }

    /** The estimate of β_i'λ + λ_0 for each asset: the mean excess return the model predicts. */
    double[] predicted() {
        double[] out = new double[assets];
        int k = model.factorColumns().size();
        int lambda = intercept() ? 1 : 0;
        for (int i = 0; i < assets; i++) {
            double value = intercept() ? fit.parameters().get(0).estimate() : 0.0;
            for (int j = 0; j < k; j++) {
                value += fit.parameters().get(coefficients + assets + i * k + j).estimate()
                        * fit.parameters().get(lambda + j).estimate();
            }
            out[i] = value;
        }
        return out;
    }

    /** The realised mean excess returns, predicted plus α. */
    double[] realised() {
        double[] out = predicted();
        for (int i = 0; i < assets; i++) {
            out[i] += pricingErrors().get(i).error();
        }
        return out;
    }

    /** One row per asset: a and each β with GMM standard errors, in console text. */
    String console() {
        List<String> header = new ArrayList<>(List.of("asset", "a", "std. error"));
        for (String factor : model.factorColumns()) {
            header.add("beta_" + factor);
            header.add("std. error");
        }
        TextTable table = new TextTable(header);
        List<List<ParameterEstimate>> rows = rows();
        for (int i = 0; i < rows.size(); i++) {
            List<String> cells = new ArrayList<>(List.of(pricingErrors().get(i).asset()));
            for (ParameterEstimate p : rows.get(i)) {
                cells.add(ConsoleReport.number(p.estimate()));
                cells.add(ConsoleReport.number(p.stdError()));
            }
            table.row(cells);
        }
        return "Time-series regressions inside the system (GMM standard errors)\n" + table.render("  ");
    }

    /** The same as a report table, standard errors under the estimates. */
    Table table() {
        List<String> header = new ArrayList<>(List.of("asset", "a", "se(a)"));
        for (String factor : model.factorColumns()) {
            header.add("beta " + factor);
            header.add("se(beta " + factor + ")");
        }
        Table.Builder table = Table.builder("time-series", "Time-series intercepts and betas", header)
                .errorUnder("a", "se(a)");
        for (String factor : model.factorColumns()) {
            table.errorUnder("beta " + factor, "se(beta " + factor + ")");
        }
        List<List<ParameterEstimate>> rows = rows();
        for (int i = 0; i < rows.size(); i++) {
            List<Cell> cells = new ArrayList<>(List.of(Cell.text(pricingErrors().get(i).asset())));
            for (ParameterEstimate p : rows.get(i)) {
                cells.add(Cell.number(p.estimate()));
                cells.add(Cell.number(p.stdError()));
            }
            table.row(cells);
        }
        return table.note("R^e_t = a + beta f_t + eps_t by least squares, estimated jointly with the cross section; "
                + "GMM standard errors in parentheses, with the model file's long-run covariance.").build();
    }

    /** [a_i, β_i1, ..., β_iK] per asset. */
    private List<List<ParameterEstimate>> rows() {
        int k = model.factorColumns().size();
        List<ParameterEstimate> all = timeSeries();
        List<List<ParameterEstimate>> rows = new ArrayList<>();
        for (int i = 0; i < assets; i++) {
            List<ParameterEstimate> row = new ArrayList<>(List.of(all.get(i)));
            row.addAll(all.subList(assets + i * k, assets + (i + 1) * k));
            rows.add(row);
        }
        return rows;
    }
}
