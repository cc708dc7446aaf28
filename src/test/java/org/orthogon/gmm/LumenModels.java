package org.orthogon.gmm;

import org.ejml.data.DMatrixRMaj;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;

/** Moment models on simulated Lumen samples, shared by the estimator tests. */
final class LumenModels {
    private LumenModels() {
    }

    /** The linear SDF m = 1 - b'F on the first {@code assets} portfolios' excess returns, {@code years} years. */
    static MomentModel linearSdf(int assets, int years, long seed) {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, years, seed);
        int months = sample.months().size();
        double[][] excess = new double[months][assets];
        for (int t = 0; t < months; t++) {
            for (int i = 0; i < assets; i++) {
                excess[t][i] = sample.portfolioReturns()[t][i] - sample.riskfree()[t];
            }
        }
        return org.orthogon.moments.ScaledMoments.unscaled(new LinearFactorErrors(excess, sample.factors(),
                economy.portfolioNames().subList(0, assets), economy.factorNames()));
    }

    /** The same moments with moment {@code index} multiplied by {@code factor} (its payoff and price too). */
    static MomentModel rescaled(MomentModel model, int index, double factor) {
        return new ForwardingMomentModel(model) {
            @Override
            public DMatrixRMaj contributions(double[] theta) {
                return scaleColumn(base.contributions(theta), index, factor);
            }

            @Override
            public DMatrixRMaj meanJacobian(double[] theta) {
                DMatrixRMaj d = base.meanJacobian(theta);
                for (int p = 0; p < d.numCols; p++) {
                    d.set(index, p, d.get(index, p) * factor);
                }
                return d;
            }

            @Override
            public DMatrixRMaj payoffs() {
                return scaleColumn(base.payoffs(), index, factor);
            }
        };
    }

    private static DMatrixRMaj scaleColumn(DMatrixRMaj m, int column, double factor) {
        for (int t = 0; t < m.numRows; t++) {
            m.set(t, column, m.get(t, column) * factor);
        }
        return m;
    }
}
