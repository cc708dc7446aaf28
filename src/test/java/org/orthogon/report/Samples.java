package org.orthogon.report;

import java.util.List;

/** Small documents in the Isle of Lumen scenario, with every table layout and chart kind, for the writer tests. */
final class Samples {
    private Samples() {
    }

    static Table parameters() {
        return Table.builder("parameters", "Tide premium: estimates", "parameter", "estimate", "std. error",
                "p-value").errorUnder("estimate", "std. error")
                .row(Cell.text("b_TIDE"), Cell.number(4.718808), Cell.number(1.368757), Cell.fixed(0.000566, 4))
                .row(Cell.text("b_MKT"), Cell.number(-0.5), Cell.number(Double.NaN), Cell.fixed(0.5, 4))
                .note("J = 8.535 with 9 degrees of freedom, p-value 0.4813.")
                .build();
    }

    /** Text that every writer must escape: LaTeX specials, Markdown pipes, spreadsheet formulas. */
    static Table awkward() {
        return Table.builder("awkward", "Harbour & dock 100% \"special\" #1", "name", "value")
                .row(Cell.text("=SUM(A1:A9)"), Cell.number(-0.5))
                .row(Cell.text("+tide"), Cell.number(1e-7))
                .row(Cell.text("-ebb"), Cell.count(3))
                .row(Cell.text("@harbour"), Cell.fixed(2.25, 2))
                .row(Cell.text("a_b {c} ~d ^e \\f $g | h, \"q\""), Cell.number(Double.NaN))
                .note("Costs in $ at 5% & rising; x_1 ~ y^2 {braced} #tag \\ end")
                .build();
    }

    static Report report() {
        List<String> dates = List.of("1990-01", "1991-01", "1992-01", "1993-01", "1994-01");
        return Report.builder("Lumen <three-factor> & tide")
                .subtitle("monthly sample 1962-01 to 2024-12, T = 756")
                .section("Parameters").paragraph("Estimates with standard errors.").table(parameters())
                .section("Odd text").table(awkward())
                .section("Charts")
                .chart(new Chart.Scatter("realised-vs-implied", "Realised against implied", "implied", "realised",
                        List.of(new Chart.Point("S1T1", 0.0058, 0.0065), new Chart.Point("S3T4", 0.0053, 0.0051))))
                .chart(new Chart.ErrorBars("pricing-errors", "Pricing errors", "asset", "error",
                        List.of(new Chart.Estimate("S1T1", 0.0007, 0.0008), new Chart.Estimate("S3T4", -0.0002,
                                0.0004))))
                .chart(new Chart.Bands("rolling-paths", "Rolling estimates", "window end", "estimate", dates,
                        List.of(new Chart.Path("b_TIDE", List.of(4.1, 4.5, 4.9, 4.6, 4.7),
                                List.of(1.2, 1.1, Double.NaN, 1.0, 0.9)))))
                .chart(new Chart.Sequence("sup-wald", "Wald statistic by break date", "break date", "Wald",
                        dates, List.of(2.0, 5.5, 9.1, 4.0, 3.2), 14.13, "5% critical value 14.13"))
                .warnings(List.of("K = 12 moments against T = 60 observations"))
                .build();
    }
}
