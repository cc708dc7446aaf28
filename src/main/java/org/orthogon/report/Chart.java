package org.orthogon.report;

import java.util.List;

/**
 * What a chart shows, independent of how it is drawn ({@link ChartRenderer} draws PNG and SVG).
 * Every kind has an id (the file name of its images), a title and axis labels.
 */
public sealed interface Chart {
    /** The multiple of the standard error that error bars and bands span on each side (a 95% normal interval). */
    double BAND = 1.96;

    /** File-name-safe identifier. */
    String id();

    /** The title drawn above the plot. */
    String title();

    /** Label of the horizontal axis. */
    String xLabel();

    /** Label of the vertical axis. */
    String yLabel();

    /** A labelled point of a scatter chart. */
    record Point(String label, double x, double y) {
    }

    /**
     * Realised against model-implied values, one labelled point per asset, with the 45-degree line on
     * which a model that prices every asset exactly would put every point.
     */
    record Scatter(String id, String title, String xLabel, String yLabel, List<Point> points) implements Chart {
        public Scatter {
            checkId(id);
            points = List.copyOf(points);
        }
    }

    /** One estimate with its standard error, for error-bar charts. */
    record Estimate(String label, double value, double stdError) {
    }

    /** One point per item (asset) with a bar of ±{@link #BAND} standard errors around it and a zero line. */
    record ErrorBars(String id, String title, String xLabel, String yLabel, List<Estimate> estimates)
            implements Chart {
        public ErrorBars {
            checkId(id);
            estimates = List.copyOf(estimates);
        }
    }

    /**
     * A path over dates: values and standard errors at each date; drawn as a line with a shaded band
     * of ±{@link #BAND} standard errors (a missing standard error leaves a gap in the band).
     */
    record Path(String name, List<Double> values, List<Double> stdErrors) {
        public Path {
            values = List.copyOf(values);
            stdErrors = List.copyOf(stdErrors);
            if (values.size() != stdErrors.size()) {
                throw new IllegalArgumentException("path " + name + ": " + values.size() + " values but "
                        + stdErrors.size() + " standard errors");
            }
        }
    }

    /**
     * Paths with bands over dates, e.g. rolling-window parameter estimates. Dates are period labels
     * (YYYY-MM, YYYYQn, YYYY or YYYY-MM-DD), one per position of every path.
     */
    record Bands(String id, String title, String xLabel, String yLabel, List<String> dates, List<Path> paths)
            implements Chart {
        public Bands {
            checkId(id);
            dates = List.copyOf(dates);
            paths = List.copyOf(paths);
            for (Path path : paths) {
                if (path.values().size() != dates.size()) {
                    throw new IllegalArgumentException("path " + path.name() + " has " + path.values().size()
                            + " values for " + dates.size() + " dates");
                }
            }
        }
    }

    /**
     * A statistic over dates with a horizontal critical-value line, e.g. the Wald statistic at each
     * candidate break date against the critical value of its supremum.
     */
    record Sequence(String id, String title, String xLabel, String yLabel, List<String> dates, List<Double> values,
            double criticalValue, String criticalLabel) implements Chart {
        public Sequence {
            checkId(id);
            dates = List.copyOf(dates);
            values = List.copyOf(values);
            if (dates.size() != values.size()) {
                throw new IllegalArgumentException(values.size() + " values for " + dates.size() + " dates");
            }
        }
    }

    /**
     * A curve (a frontier or bound, drawn as a line) with labelled points placed against it, e.g. the
     * Hansen-Jagannathan volatility bound with the models' SDFs at their mean and volatility.
     */
    record Frontier(String id, String title, String xLabel, String yLabel, List<Point> curve, List<Point> points)
            implements Chart {
        public Frontier {
            checkId(id);
            curve = List.copyOf(curve);
            points = List.copyOf(points);
        }
    }

    /**
     * The distribution of simulated draws of a statistic as a histogram of counts, with a vertical line at
     * one value (e.g. the bootstrap replications of J with the sample's J marked).
     */
    record Histogram(String id, String title, String xLabel, String yLabel, List<Double> draws, double marker,
            String markerLabel) implements Chart {
        public Histogram {
            checkId(id);
            draws = List.copyOf(draws);
        }
    }

    /** A named line of (x, y) points. */
    record Curve(String name, List<Point> points) {
        public Curve {
            points = List.copyOf(points);
        }
    }

    /** A horizontal reference line at a value, labelled. */
    record Level(double value, String label) {
    }

    /**
     * Statistics drawn against a parameter value, each with its horizontal critical-value line, and a vertical
     * line at the point estimate: e.g. the concentrated S and K statistics of weak-identification-robust sets,
     * whose sets are the values where a curve lies below its line. Points with a non-finite value leave a gap.
     */
    record Profile(String id, String title, String xLabel, String yLabel, List<Curve> curves, List<Level> levels,
            double marker, String markerLabel) implements Chart {
        public Profile {
            checkId(id);
            curves = List.copyOf(curves);
            levels = List.copyOf(levels);
        }
    }

    /**
     * A region of a plane on a rectangular grid: the cells whose flag is set are filled, with a marked point
     * (e.g. a joint confidence set over two parameters, with the estimate). {@code inside[r][c]} belongs to
     * (xs[c], ys[r]).
     */
    record Region(String id, String title, String xLabel, String yLabel, List<Double> xs, List<Double> ys,
            List<List<Boolean>> inside, Point marker) implements Chart {
        public Region {
            checkId(id);
            xs = List.copyOf(xs);
            ys = List.copyOf(ys);
            inside = inside.stream().map(List::copyOf).toList();
            int columns = xs.size();
            if (inside.size() != ys.size() || inside.stream().anyMatch(row -> row.size() != columns)) {
                throw new IllegalArgumentException("region " + id + ": the flags must be " + ys.size() + " rows of "
                        + xs.size());
            }
        }
    }

    private static void checkId(String id) {
        if (!id.matches("[a-z0-9]+(-[a-z0-9]+)*")) {
            throw new IllegalArgumentException("chart id \"" + id + "\" must be lower-case words joined by hyphens");
        }
    }
}
