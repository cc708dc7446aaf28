package org.orthogon.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Rectangle;
import java.awt.geom.Ellipse2D;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.text.DecimalFormat;
import java.util.List;
import javax.imageio.ImageIO;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYLineAnnotation;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.CategoryAxis;
import org.jfree.chart.axis.CategoryLabelPositions;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTickUnit;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.category.StatisticalLineAndShapeRenderer;
import org.jfree.chart.renderer.xy.DeviationRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleAnchor;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.Range;
import org.jfree.data.statistics.DefaultStatisticalCategoryDataset;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;
import org.jfree.svg.SVGGraphics2D;
import org.orthogon.data.Period;

/**
 * Draws {@link Chart} specifications with JFreeChart: PNG for slides, SVG (with real text) for
 * papers and for the HTML report. Runs headless; call {@link #headless()} before the first chart in
 * a process that did not set {@code java.awt.headless}.
 */
public final class ChartRenderer {
    /** Default image size in pixels. */
    public static final int WIDTH = 760;
    /** Default image height in pixels. */
    public static final int HEIGHT = 460;
    /** Side of a square chart: one that draws a 45-degree line, which only a square plot shows at 45 degrees. */
    public static final int SQUARE = 560;
    /** PNG files carry this many pixels per layout pixel: a 760-pixel-wide chart prints sharp at column width. */
    public static final int PRINT_SCALE = 2;

    /** Dark slate for points and lines: prints as near-black. */
    static final Color INK = new Color(0x23, 0x33, 0x44);
    /** Muted teal, the one accent colour. */
    static final Color ACCENT = new Color(0x2E, 0x6E, 0x73);
    /** Ochre for reference lines (45-degree, zero, critical value), distinct from the data in grey print. */
    static final Color REFERENCE = new Color(0xA8, 0x6A, 0x1E);
    private static final Color GRID = new Color(0xDD, 0xE1, 0xE5);
    private static final Color[] SERIES = {ACCENT, new Color(0x7A, 0x4E, 0x8C), new Color(0x55, 0x6B, 0x2F),
        new Color(0x8C, 0x3B, 0x3B)};
    private static final Font TITLE = new Font(Font.SANS_SERIF, Font.BOLD, 15);
    private static final Font LABEL = new Font(Font.SANS_SERIF, Font.PLAIN, 12);
    private static final Font TICK = new Font(Font.SANS_SERIF, Font.PLAIN, 11);

    private ChartRenderer() {
    }

    /** Makes AWT run without a display; charts are drawn into memory only. */
    public static void headless() {
        System.setProperty("java.awt.headless", "true");
        // The workaround draws rotated labels as glyph outlines; without it SVG keeps them as <text>.
        org.jfree.chart.text.TextUtils.setUseDrawRotatedStringWorkaround(false);
    }

    /** The layout width of {@code chart}: square for a chart with a 45-degree line, wide otherwise. */
    public static int width(Chart chart) {
        return chart instanceof Chart.Scatter ? SQUARE : WIDTH;
    }

    /** The layout height of {@code chart}. */
    public static int height(Chart chart) {
        return chart instanceof Chart.Scatter ? SQUARE : HEIGHT;
    }

    /** The chart as PNG bytes of the given size. */
    public static byte[] png(Chart chart, int width, int height) {
        return png(chart, width, height, 1);
    }

    /**
     * The chart laid out at {@code width} x {@code height} and drawn {@code scale} times as many pixels
     * each way: the same picture as the SVG, at print resolution.
     */
    public static byte[] png(Chart chart, int width, int height, int scale) {
        headless();
        BufferedImage image = new BufferedImage(width * scale, height * scale, BufferedImage.TYPE_INT_RGB);
        java.awt.Graphics2D g2 = image.createGraphics();
        g2.scale(scale, scale);
        build(chart).draw(g2, new java.awt.geom.Rectangle2D.Double(0, 0, width, height));
        g2.dispose();
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try {
            ImageIO.write(image, "png", bytes);
        } catch (IOException e) {
            throw new UncheckedIOException("encoding a PNG in memory cannot fail", e);
        }
        return bytes.toByteArray();
    }

    /** The chart as a standalone SVG document (with XML declaration), text kept as text. */
    public static String svgDocument(Chart chart, int width, int height) {
        return draw(chart, width, height, true).getSVGDocument();
    }

    /**
     * The chart as an {@code <svg>} element for embedding in HTML: no namespace declarations (the
     * HTML parser supplies them, and the report stays free of any address), ids prefixed with the
     * chart id so several charts can share one page, a viewBox so it scales with the page, and no
     * title inside the drawing (the page's caption carries it).
     */
    public static String svgElement(Chart chart, int width, int height) {
        String element = draw(chart, width, height, false).getSVGElement(chart.id());
        element = element.replaceAll("\\s+xmlns(:\\w+)?=(\"[^\"]*\"|'[^']*')", "");
        element = element.replaceFirst("\\s+width=['\"][0-9.]+['\"]\\s+height=['\"][0-9.]+['\"]", "");
        return element.replaceFirst("<svg ", "<svg viewBox=\"0 0 " + width + " " + height
                + "\" role=\"img\" aria-label=\"" + Html.escape(chart.title()) + "\" ");
    }

    private static SVGGraphics2D draw(Chart chart, int width, int height, boolean withTitle) {
        headless();
        SVGGraphics2D g2 = new SVGGraphics2D(width, height);
        g2.setDefsKeyPrefix(chart.id() + "-");
        build(chart, withTitle).draw(g2, new Rectangle(0, 0, width, height));
        return g2;
    }

    /** The JFreeChart object for a specification, styled in Orthogon's palette. */
    public static JFreeChart build(Chart chart) {
        return build(chart, true);
    }

    /** As {@link #build(Chart)}, without the title when the page around the chart already shows it. */
    public static JFreeChart build(Chart chart, boolean withTitle) {
        JFreeChart built;
        if (chart instanceof Chart.Scatter scatter) {
            built = scatter(scatter);
        } else if (chart instanceof Chart.ErrorBars bars) {
            built = errorBars(bars);
        } else if (chart instanceof Chart.Bands bands) {
            built = bands(bands);
        } else if (chart instanceof Chart.Frontier frontier) {
            built = frontier(frontier);
        } else if (chart instanceof Chart.Histogram histogram) {
            built = histogram(histogram);
        } else if (chart instanceof Chart.Profile profile) {
            built = profile(profile);
        } else if (chart instanceof Chart.Region region) {
            built = region(region);
        } else {
            built = sequence((Chart.Sequence) chart);
        }
        if (withTitle) {
            built.setTitle(new TextTitle(chart.title(), TITLE));
            built.getTitle().setPaint(INK);
        }
        built.setBackgroundPaint(Color.WHITE);
        built.setAntiAlias(true);
        built.setPadding(new RectangleInsets(6, 6, 6, 12));
        return built;
    }

    private static JFreeChart scatter(Chart.Scatter spec) {
        XYSeries series = new XYSeries("assets", false);
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        // A point without both coordinates cannot be placed; leaving it out keeps the axes finite.
        List<Chart.Point> points = spec.points().stream()
                .filter(p -> Double.isFinite(p.x()) && Double.isFinite(p.y())).toList();
        for (Chart.Point p : points) {
            series.add(p.x(), p.y());
            low = Math.min(low, Math.min(p.x(), p.y()));
            high = Math.max(high, Math.max(p.x(), p.y()));
        }
        if (points.isEmpty()) {
            low = 0;
            high = 1;
        }
        // Both axes share one range so that the 45-degree line is drawn at 45 degrees.
        double pad = Math.max((high - low) * 0.08, 1e-12);
        Range range = new Range(low - pad, high + pad);
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(false, true);
        renderer.setSeriesPaint(0, ACCENT);
        renderer.setSeriesShape(0, new Ellipse2D.Double(-4, -4, 8, 8));
        XYPlot plot = new XYPlot(new XYSeriesCollection(series), axis(spec.xLabel()), axis(spec.yLabel()), renderer);
        label(plot, points, range.getLength());
        plot.getDomainAxis().setRange(range);
        plot.getRangeAxis().setRange(range);
        XYLineAnnotation diagonal = new XYLineAnnotation(range.getLowerBound(), range.getLowerBound(),
                range.getUpperBound(), range.getUpperBound(), dashed(), REFERENCE);
        diagonal.setToolTipText("45-degree line: model-implied equals realised");
        plot.addAnnotation(diagonal);
        style(plot);
        return new JFreeChart(null, LABEL, plot, false);
    }

    /**
     * Labels each point beside it: to the right, else to the left, above or below, whichever first
     * keeps clear of the labels already placed and of the other markers (the least crowded when none
     * is clear). Sizes are estimated in data units from the plot's usual size in pixels, which is
     * enough to keep neighbouring portfolio names apart.
     */
    private static void label(XYPlot plot, List<Chart.Point> points, double span) {
        double charWidth = span * 0.0105;
        double lineHeight = span * 0.036;
        double markerX = span * 0.008;
        double markerY = span * 0.014;
        double gapX = span * 0.01;
        double gapY = span * 0.012;
        List<double[]> taken = new java.util.ArrayList<>();
        for (Chart.Point p : points) {
            taken.add(new double[] {p.x() - markerX, p.y() - markerY, p.x() + markerX, p.y() + markerY});
        }
        TextAnchor[] anchors = {TextAnchor.CENTER_LEFT, TextAnchor.CENTER_RIGHT, TextAnchor.BOTTOM_CENTER,
            TextAnchor.TOP_CENTER};
        for (int i = 0; i < points.size(); i++) {
            Chart.Point p = points.get(i);
            double width = charWidth * p.label().length();
            double[][] boxes = {
                {p.x() + gapX, p.y() - lineHeight / 2, p.x() + gapX + width, p.y() + lineHeight / 2},
                {p.x() - gapX - width, p.y() - lineHeight / 2, p.x() - gapX, p.y() + lineHeight / 2},
                {p.x() - width / 2, p.y() + gapY, p.x() + width / 2, p.y() + gapY + lineHeight},
                {p.x() - width / 2, p.y() - gapY - lineHeight, p.x() + width / 2, p.y() - gapY}};
            double[] anchorX = {p.x() + gapX, p.x() - gapX, p.x(), p.x()};
            double[] anchorY = {p.y(), p.y(), p.y() + gapY, p.y() - gapY};
            int best = 0;
            double bestOverlap = Double.POSITIVE_INFINITY;
            for (int c = 0; c < boxes.length && bestOverlap > 0; c++) {
                double overlap = 0;
                for (int j = 0; j < taken.size(); j++) {
                    if (j != i) {
                        overlap += overlap(boxes[c], taken.get(j));
                    }
                }
                if (overlap < bestOverlap) {
                    bestOverlap = overlap;
                    best = c;
                }
            }
            taken.add(boxes[best]);
            XYTextAnnotation text = new XYTextAnnotation(p.label(), anchorX[best], anchorY[best]);
            text.setFont(TICK);
            text.setPaint(INK);
            text.setTextAnchor(anchors[best]);
            plot.addAnnotation(text);
        }
    }

    /** The area two boxes {x0, y0, x1, y1} share. */
    private static double overlap(double[] a, double[] b) {
        double w = Math.min(a[2], b[2]) - Math.max(a[0], b[0]);
        double h = Math.min(a[3], b[3]) - Math.max(a[1], b[1]);
        return w > 0 && h > 0 ? w * h : 0;
    }

    private static JFreeChart frontier(Chart.Frontier spec) {
        XYSeriesCollection data = new XYSeriesCollection();
        XYSeries curve = new XYSeries("bound", false);
        spec.curve().stream().filter(p -> Double.isFinite(p.x()) && Double.isFinite(p.y()))
                .forEach(p -> curve.add(p.x(), p.y()));
        XYSeries points = new XYSeries("points", false);
        List<Chart.Point> placed = spec.points().stream()
                .filter(p -> Double.isFinite(p.x()) && Double.isFinite(p.y())).toList();
        placed.forEach(p -> points.add(p.x(), p.y()));
        data.addSeries(curve);
        data.addSeries(points);
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        renderer.setSeriesLinesVisible(0, true);
        renderer.setSeriesShapesVisible(0, false);
        renderer.setSeriesPaint(0, REFERENCE);
        renderer.setSeriesStroke(0, new BasicStroke(1.8f));
        renderer.setSeriesLinesVisible(1, false);
        renderer.setSeriesShapesVisible(1, true);
        renderer.setSeriesPaint(1, ACCENT);
        renderer.setSeriesShape(1, new Ellipse2D.Double(-4, -4, 8, 8));
        XYPlot plot = new XYPlot(data, axis(spec.xLabel()), axis(spec.yLabel()), renderer);
        ((NumberAxis) plot.getDomainAxis()).setAutoRangeIncludesZero(false);
        ((NumberAxis) plot.getRangeAxis()).setAutoRangeIncludesZero(true);
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        for (Chart.Point p : spec.curve()) {
            low = Math.min(low, p.y());
            high = Math.max(high, p.y());
        }
        for (Chart.Point p : placed) {
            high = Math.max(high, p.y());
        }
        label(plot, placed, Double.isFinite(high - low) && high > low ? high - low : 1.0);
        style(plot);
        return new JFreeChart(null, LABEL, plot, false);
    }

    private static JFreeChart errorBars(Chart.ErrorBars spec) {
        DefaultStatisticalCategoryDataset data = new DefaultStatisticalCategoryDataset();
        for (Chart.Estimate e : spec.estimates()) {
            // The renderer draws value ± the second number, so the band half-width goes there.
            // A missing value stays a labelled empty slot, so the axis still lists every item.
            data.add(Double.isFinite(e.value()) ? e.value() : null,
                    Double.isFinite(e.stdError()) ? Chart.BAND * e.stdError() : null, "estimate", e.label());
        }
        StatisticalLineAndShapeRenderer renderer = new StatisticalLineAndShapeRenderer(false, true);
        renderer.setSeriesPaint(0, ACCENT);
        renderer.setSeriesShape(0, new Ellipse2D.Double(-4, -4, 8, 8));
        renderer.setErrorIndicatorPaint(INK);
        renderer.setErrorIndicatorStroke(new BasicStroke(1.2f));
        CategoryAxis categories = new CategoryAxis(spec.xLabel());
        categories.setLabelFont(LABEL);
        categories.setTickLabelFont(TICK);
        categories.setTickLabelPaint(INK);
        categories.setLabelPaint(INK);
        if (spec.estimates().size() > 8) {
            categories.setCategoryLabelPositions(CategoryLabelPositions.UP_45);
        }
        CategoryPlot plot = new CategoryPlot(data, categories, axis(spec.yLabel()), renderer);
        plot.addRangeMarker(reference(0.0, null));
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(GRID);
        plot.setDomainGridlinesVisible(false);
        plot.setOutlineVisible(false);
        ((NumberAxis) plot.getRangeAxis()).setAutoRangeIncludesZero(true);
        return new JFreeChart(null, LABEL, plot, false);
    }

    private static JFreeChart bands(Chart.Bands spec) {
        double[] x = positions(spec.dates());
        XYSeriesCollection lines = new XYSeriesCollection();
        YIntervalSeriesCollection bands = new YIntervalSeriesCollection();
        XYLineAndShapeRenderer lineRenderer = new XYLineAndShapeRenderer(true, false);
        DeviationRenderer bandRenderer = new DeviationRenderer(false, false);
        bandRenderer.setAlpha(0.2f);
        for (int p = 0; p < spec.paths().size(); p++) {
            Chart.Path path = spec.paths().get(p);
            Color colour = SERIES[p % SERIES.length];
            XYSeries line = new XYSeries(path.name(), false);
            for (int i = 0; i < x.length; i++) {
                line.add(x[i], path.values().get(i));
            }
            lines.addSeries(line);
            lineRenderer.setSeriesPaint(p, colour);
            lineRenderer.setSeriesStroke(p, new BasicStroke(1.6f));
            // A date without a standard error splits the band, so no interval is drawn where none is known.
            YIntervalSeries band = null;
            for (int i = 0; i < x.length; i++) {
                double value = path.values().get(i);
                double half = Chart.BAND * path.stdErrors().get(i);
                if (!Double.isFinite(half) || !Double.isFinite(value)) {
                    band = null;
                    continue;
                }
                if (band == null) {
                    band = new YIntervalSeries(path.name() + " band " + bands.getSeriesCount(), false, true);
                    bandRenderer.setSeriesFillPaint(bands.getSeriesCount(), colour);
                    bandRenderer.setSeriesPaint(bands.getSeriesCount(), colour);
                    bandRenderer.setSeriesVisibleInLegend(bands.getSeriesCount(), false);
                    bands.addSeries(band);
                }
                band.add(x[i], value, value - half, value + half);
            }
        }
        XYPlot plot = new XYPlot(lines, yearAxis(spec.xLabel()), axis(spec.yLabel()), lineRenderer);
        plot.setDataset(1, bands);
        plot.setRenderer(1, bandRenderer);
        // Bands behind the lines.
        plot.setDatasetRenderingOrder(org.jfree.chart.plot.DatasetRenderingOrder.REVERSE);
        style(plot);
        return new JFreeChart(null, LABEL, plot, spec.paths().size() > 1);
    }

    private static JFreeChart sequence(Chart.Sequence spec) {
        XYSeries series = new XYSeries("statistic", false);
        double[] x = positions(spec.dates());
        for (int i = 0; i < x.length; i++) {
            series.add(x[i], spec.values().get(i));
        }
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(true, false);
        renderer.setSeriesPaint(0, ACCENT);
        renderer.setSeriesStroke(0, new BasicStroke(1.6f));
        XYPlot plot = new XYPlot(new XYSeriesCollection(series), yearAxis(spec.xLabel()), axis(spec.yLabel()),
                renderer);
        plot.addRangeMarker(reference(spec.criticalValue(), spec.criticalLabel()));
        NumberAxis values = (NumberAxis) plot.getRangeAxis();
        double top = spec.values().stream().mapToDouble(Double::doubleValue).filter(Double::isFinite).max()
                .orElse(spec.criticalValue());
        // Keep the critical line inside the plot even when every statistic lies far below it.
        values.setRange(0.0, Math.max(top, spec.criticalValue()) * 1.1 + 1e-12);
        style(plot);
        return new JFreeChart(null, LABEL, plot, false);
    }

    /**
     * Bars of counts over equal bins between the smallest and largest draw (and the marker), about
     * 2 B^{1/3} bins (Terrell and Scott 1985, "Oversmoothed nonparametric density estimates", JASA 80),
     * with the marker as a dashed vertical line.
     */
    private static JFreeChart histogram(Chart.Histogram spec) {
        double[] draws = spec.draws().stream().mapToDouble(Double::doubleValue).filter(Double::isFinite).toArray();
        double low = spec.marker();
        double high = spec.marker();
        for (double d : draws) {
            low = Math.min(low, d);
            high = Math.max(high, d);
        }
        int bins = Math.max(5, (int) Math.ceil(2.0 * Math.cbrt(Math.max(1, draws.length))));
        double width = high > low ? (high - low) / bins : 1.0;
        int[] counts = new int[bins];
        for (double d : draws) {
            counts[Math.min(bins - 1, (int) ((d - low) / width))]++;
        }
        org.jfree.data.xy.XYIntervalSeries series = new org.jfree.data.xy.XYIntervalSeries("draws");
        for (int b = 0; b < bins; b++) {
            double from = low + b * width;
            series.add(from + width / 2, from, from + width, counts[b], 0.0, counts[b]);
        }
        org.jfree.data.xy.XYIntervalSeriesCollection data = new org.jfree.data.xy.XYIntervalSeriesCollection();
        data.addSeries(series);
        org.jfree.chart.renderer.xy.XYBarRenderer renderer = new org.jfree.chart.renderer.xy.XYBarRenderer(0.05);
        renderer.setBarPainter(new org.jfree.chart.renderer.xy.StandardXYBarPainter());
        renderer.setShadowVisible(false);
        renderer.setSeriesPaint(0, ACCENT);
        NumberAxis counted = axis(spec.yLabel());
        counted.setAutoRangeIncludesZero(true);
        XYPlot plot = new XYPlot(data, axis(spec.xLabel()), counted, renderer);
        plot.addDomainMarker(reference(spec.marker(), spec.markerLabel()));
        style(plot);
        return new JFreeChart(null, LABEL, plot, false);
    }

    /**
     * Curves against a parameter with their critical-value lines. The vertical axis starts at zero and stops at
     * three times the largest line (values above are clipped), so the crossings that define the sets stay
     * readable however large a statistic grows at the ends of the range.
     */
    private static JFreeChart profile(Chart.Profile spec) {
        XYSeriesCollection data = new XYSeriesCollection();
        for (Chart.Curve curve : spec.curves()) {
            XYSeries series = new XYSeries(curve.name(), false);
            for (Chart.Point p : curve.points()) {
                series.add(p.x(), Double.isFinite(p.y()) ? Double.valueOf(p.y()) : null);
            }
            data.addSeries(series);
        }
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(true, false);
        for (int i = 0; i < spec.curves().size(); i++) {
            renderer.setSeriesPaint(i, SERIES[i % SERIES.length]);
            renderer.setSeriesStroke(i, new BasicStroke(1.6f));
        }
        XYPlot plot = new XYPlot(data, axis(spec.xLabel()), axis(spec.yLabel()), renderer);
        double top = 0.0;
        for (Chart.Level level : spec.levels()) {
            plot.addRangeMarker(reference(level.value(), level.label()));
            top = Math.max(top, level.value());
        }
        double highest = spec.curves().stream().flatMap(c -> c.points().stream()).mapToDouble(Chart.Point::y)
                .filter(Double::isFinite).max().orElse(top);
        plot.getRangeAxis().setRange(0.0, Math.max(Math.min(highest, 3.0 * top), top) * 1.05 + 1e-12);
        if (Double.isFinite(spec.marker())) {
            ValueMarker estimate = new ValueMarker(spec.marker(), INK, dashed());
            estimate.setLabel(spec.markerLabel());
            estimate.setLabelFont(TICK);
            estimate.setLabelPaint(INK);
            estimate.setLabelAnchor(RectangleAnchor.TOP_LEFT);
            estimate.setLabelTextAnchor(TextAnchor.TOP_RIGHT);
            plot.addDomainMarker(estimate);
        }
        style(plot);
        JFreeChart chart = new JFreeChart(null, LABEL, plot, spec.curves().size() > 1);
        if (chart.getLegend() != null) {
            chart.getLegend().setItemFont(TICK);
            chart.getLegend().setFrame(org.jfree.chart.block.BlockBorder.NONE);
        }
        return chart;
    }

    /** Grid cells of a region drawn as filled blocks, the marked point on top. */
    private static JFreeChart region(Chart.Region spec) {
        org.jfree.data.xy.DefaultXYZDataset cells = new org.jfree.data.xy.DefaultXYZDataset();
        List<double[]> inside = new java.util.ArrayList<>();
        for (int r = 0; r < spec.ys().size(); r++) {
            for (int c = 0; c < spec.xs().size(); c++) {
                if (spec.inside().get(r).get(c)) {
                    inside.add(new double[] {spec.xs().get(c), spec.ys().get(r)});
                }
            }
        }
        double[][] xyz = new double[3][inside.size()];
        for (int i = 0; i < inside.size(); i++) {
            xyz[0][i] = inside.get(i)[0];
            xyz[1][i] = inside.get(i)[1];
            xyz[2][i] = 1.0;
        }
        cells.addSeries("inside", xyz);
        org.jfree.chart.renderer.xy.XYBlockRenderer blocks = new org.jfree.chart.renderer.xy.XYBlockRenderer();
        double width = spec.xs().size() > 1 ? spec.xs().get(1) - spec.xs().get(0) : 1.0;
        double height = spec.ys().size() > 1 ? spec.ys().get(1) - spec.ys().get(0) : 1.0;
        blocks.setBlockWidth(width);
        blocks.setBlockHeight(height);
        org.jfree.chart.renderer.LookupPaintScale scale = new org.jfree.chart.renderer.LookupPaintScale(0.0, 2.0,
                Color.WHITE);
        scale.add(0.5, new Color(ACCENT.getRed(), ACCENT.getGreen(), ACCENT.getBlue(), 150));
        blocks.setPaintScale(scale);
        NumberAxis x = axis(spec.xLabel());
        NumberAxis y = axis(spec.yLabel());
        XYPlot plot = new XYPlot(cells, x, y, blocks);
        x.setRange(spec.xs().get(0) - width / 2, spec.xs().get(spec.xs().size() - 1) + width / 2);
        y.setRange(spec.ys().get(0) - height / 2, spec.ys().get(spec.ys().size() - 1) + height / 2);
        Chart.Point marker = spec.marker();
        if (marker != null && Double.isFinite(marker.x()) && Double.isFinite(marker.y())) {
            XYSeries point = new XYSeries(marker.label(), false);
            point.add(marker.x(), marker.y());
            XYLineAndShapeRenderer dot = new XYLineAndShapeRenderer(false, true);
            dot.setSeriesPaint(0, INK);
            dot.setSeriesShape(0, new Ellipse2D.Double(-4, -4, 8, 8));
            plot.setDataset(1, new XYSeriesCollection(point));
            plot.setRenderer(1, dot);
        }
        style(plot);
        return new JFreeChart(null, LABEL, plot, false);
    }

    /** Decimal years of period labels (1990-01 -> 1990.0, 1990Q3 -> 1990.5), so dates space evenly. */
    static double[] positions(List<String> dates) {
        double[] x = new double[dates.size()];
        for (int i = 0; i < x.length; i++) {
            Period period = Period.parse(dates.get(i));
            x[i] = period.year() + (period.subPeriod() - 1.0) / period.frequency().periodsPerYear();
        }
        return x;
    }

    private static NumberAxis axis(String label) {
        NumberAxis axis = new NumberAxis(label);
        axis.setLabelFont(LABEL);
        axis.setLabelPaint(INK);
        axis.setTickLabelFont(TICK);
        axis.setTickLabelPaint(INK);
        axis.setAutoRangeIncludesZero(false);
        return axis;
    }

    private static NumberAxis yearAxis(String label) {
        NumberAxis axis = axis(label);
        axis.setNumberFormatOverride(new DecimalFormat("0"));
        axis.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        axis.setTickUnit(new NumberTickUnit(5), false, false);
        axis.setAutoTickUnitSelection(true);
        return axis;
    }

    private static ValueMarker reference(double value, String label) {
        ValueMarker marker = new ValueMarker(value, REFERENCE, dashed());
        if (label != null) {
            marker.setLabel(label);
            marker.setLabelFont(TICK);
            marker.setLabelPaint(REFERENCE);
            marker.setLabelBackgroundColor(new Color(255, 255, 255, 0));
            marker.setLabelOffset(new RectangleInsets(2, 4, 2, 4));
            marker.setLabelAnchor(RectangleAnchor.TOP_RIGHT);
            marker.setLabelTextAnchor(TextAnchor.BOTTOM_RIGHT);
        }
        return marker;
    }

    private static BasicStroke dashed() {
        return new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f, new float[] {5f, 4f}, 0f);
    }

    private static void style(XYPlot plot) {
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(GRID);
        plot.setRangeGridlinePaint(GRID);
        plot.setOutlineVisible(false);
        plot.setAxisOffset(RectangleInsets.ZERO_INSETS);
    }
}
