package org.orthogon.report;

/** The caution printed with every report. */
public final class Caution {
    /** One sentence, the same in every output form. */
    public static final String TEXT = "These are statistical estimates under stated assumptions (the model's moment "
            + "conditions, stationarity, the chosen long-run covariance estimator and large-sample approximations); "
            + "they are not investment advice.";

    private Caution() {
    }
}
