package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Chi-square upper-tail critical values against the NIST/SEMATECH e-Handbook of Statistical Methods,
 * section 1.3.6.7.4, "Critical Values of the Chi-Square Distribution" (upper-tail table, values printed
 * to three decimals; these entries are recalled from that table from memory, so the tolerance is the
 * table's own rounding, 5e-4).
 */
class ChiSquareTableTest {

    @ParameterizedTest(name = "df {0}, upper-tail probability {1}: {2}")
    @CsvSource({
        "1, 0.05, 3.841",
        "1, 0.01, 6.635",
        "2, 0.05, 5.991",
        "5, 0.05, 11.070",
        "5, 0.01, 15.086",
        "9, 0.05, 16.919",
        "10, 0.10, 15.987",
        "10, 0.05, 18.307",
        "10, 0.01, 23.209",
        "11, 0.05, 19.675",
        "20, 0.05, 31.410",
        "30, 0.05, 43.773",
    })
    void criticalValuesMatchTheNistTable(int df, double upperTail, double tabulated) {
        assertThat(ChiSquareTest.criticalValue(upperTail, df)).isCloseTo(tabulated, within(5e-4));
        // The p-value of the tabulated critical value is the table's probability, up to the table's rounding.
        assertThat(ChiSquareTest.upperTail(tabulated, df)).isCloseTo(upperTail, within(upperTail * 2e-3));
    }

    @ParameterizedTest(name = "df {0}")
    @CsvSource({"2", "4", "10"})
    void evenDegreesOfFreedomHaveAClosedFormTail(int df) {
        // For even df = 2m, P(chi2 >= x) = exp(-x/2) sum_{i<m} (x/2)^i / i!
        // (Abramowitz and Stegun 1964, 26.4.21; common practice).
        double x = 7.3;
        double term = 1.0;
        double sum = 0.0;
        for (int i = 0; i < df / 2; i++) {
            if (i > 0) {
                term *= (x / 2) / i;
            }
            sum += term;
        }
        assertThat(ChiSquareTest.upperTail(x, df)).isCloseTo(Math.exp(-x / 2) * sum, within(1e-14));
    }
}
