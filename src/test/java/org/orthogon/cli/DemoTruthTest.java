package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Paths;
import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;

/**
 * Each shipped model file, fitted to the shipped demo data, recovers the truth of the simulated
 * economy within 2.5 standard errors. The truths come from the simulator's documented parameters
 * (docs/demo-scenario.md), not from any estimate.
 */
class DemoTruthTest {
    private static final double TOLERANCE_IN_SE = 2.5;

    @Test
    void powerUtilityRecoversBetaAndGamma() {
        LumenEconomy economy = LumenEconomy.standard();
        Map<String, Double> truth = new LinkedHashMap<>();
        truth.put("beta", economy.quarterlyBeta());
        truth.put("gamma", economy.gamma());
        assertWithinTruth("lumen-power-utility.toml", truth);
    }

    @Test
    void threeFactorSdfRecoversB() {
        LumenEconomy economy = LumenEconomy.standard();
        double[] b = economy.linearSdfCoefficients();
        Map<String, Double> truth = new LinkedHashMap<>();
        truth.put("b_MKT", b[0]);
        truth.put("b_SIZE", b[1]);
        truth.put("b_TIDE", b[2]);
        assertWithinTruth("lumen-three-factor.toml", truth);
    }

    @Test
    void marketOnlySdfRecoversItsPseudoTrueB() {
        assertWithinTruth("lumen-market-only.toml",
                Map.of("b_MKT", LumenEconomy.standard().marketOnlyPseudoTrueCoefficient()));
    }

    private static void assertWithinTruth(String modelFile, Map<String, Double> truth) {
        RunSpec spec = ModelFile.read(Paths.get("models", modelFile));
        PreparedRun prepared = ModelAssembler.prepare(spec);
        GmmFit fit = GmmEstimator.estimate(prepared.moments(), prepared.startValues(),
                new GmmOptions(spec.estimation().method(), spec.estimation().longRunOptions()));
        assertThat(fit.parameters()).hasSize(truth.size());
        for (Map.Entry<String, Double> entry : truth.entrySet()) {
            ParameterEstimate estimate = fit.parameter(entry.getKey());
            double distance = Math.abs(estimate.estimate() - entry.getValue()) / estimate.stdError();
            assertThat(distance)
                    .as("%s %s: estimate %.6f, truth %.6f, SE %.6f (%.2f SE away)", modelFile, entry.getKey(),
                            estimate.estimate(), entry.getValue(), estimate.stdError(), distance)
                    .isLessThan(TOLERANCE_IN_SE);
            System.out.printf("%s %s: estimate %.6f truth %.6f SE %.6f (%.2f SE)%n", modelFile, entry.getKey(),
                    estimate.estimate(), entry.getValue(), estimate.stdError(), distance);
        }
    }
}
