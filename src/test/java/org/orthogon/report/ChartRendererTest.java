package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.util.List;
import javax.imageio.ImageIO;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.parser.Parser;
import org.jfree.chart.plot.XYPlot;
import org.jfree.data.xy.XYDataset;
import org.jfree.data.xy.YIntervalSeriesCollection;
import org.junit.jupiter.api.Test;

class ChartRendererTest {

    @Test
    void everyKindDrawsAPngOfTheAskedSize() throws IOException {
        for (Chart chart : Samples.report().charts()) {
            byte[] png = ChartRenderer.png(chart, 640, 400);
            BufferedImage image = ImageIO.read(new ByteArrayInputStream(png));
            assertThat(image.getWidth()).as(chart.id()).isEqualTo(640);
            assertThat(image.getHeight()).as(chart.id()).isEqualTo(400);
        }
    }

    @Test
    void printPngsHaveTwiceThePixelsOfTheLayoutAndScattersAreSquare() throws IOException {
        for (Chart chart : Samples.report().charts()) {
            int width = ChartRenderer.width(chart);
            int height = ChartRenderer.height(chart);
            assertThat(width == height).as(chart.id()).isEqualTo(chart instanceof Chart.Scatter);
            BufferedImage image = ImageIO.read(new ByteArrayInputStream(ChartRenderer.png(chart, width, height,
                    ChartRenderer.PRINT_SCALE)));
            assertThat(image.getWidth()).as(chart.id()).isEqualTo(2 * width);
            assertThat(image.getHeight()).as(chart.id()).isEqualTo(2 * height);
        }
    }

    @Test
    void svgDocumentsKeepTitlesLabelsAndRotatedTicksAsText() {
        for (Chart chart : Samples.report().charts()) {
            String svg = ChartRenderer.svgDocument(chart, ChartRenderer.WIDTH, ChartRenderer.HEIGHT);
            Document doc = Jsoup.parse(svg, Parser.xmlParser());
            assertThat(doc.select("svg")).hasSize(1);
            assertThat(doc.select("text").eachText()).as(chart.id()).contains(chart.title(), chart.xLabel(),
                    chart.yLabel());
        }
        Chart many = new Chart.ErrorBars("many", "Twelve portfolios", "portfolio", "error",
                List.of("S1T1", "S1T2", "S1T3", "S1T4", "S2T1", "S2T2", "S2T3", "S2T4", "S3T1", "S3T2", "S3T3",
                        "S3T4").stream().map(name -> new Chart.Estimate(name, 0.001, 0.0005)).toList());
        Document doc = Jsoup.parse(ChartRenderer.svgDocument(many, 760, 460), Parser.xmlParser());
        assertThat(doc.select("text").eachText()).contains("S1T1", "S3T4");
    }

    @Test
    void aMissingStandardErrorSplitsTheBandButNotTheLine() {
        Chart bands = Samples.report().charts().stream().filter(c -> c.id().equals("rolling-paths")).findFirst()
                .orElseThrow();
        XYPlot plot = ChartRenderer.build(bands).getXYPlot();
        XYDataset line = plot.getDataset(0);
        YIntervalSeriesCollection band = (YIntervalSeriesCollection) plot.getDataset(1);
        assertThat(line.getItemCount(0)).isEqualTo(5);
        // Dates 1990-1991 and 1993-1994 have errors; 1992 has none.
        assertThat(band.getSeriesCount()).isEqualTo(2);
        assertThat(band.getItemCount(0)).isEqualTo(2);
        assertThat(band.getStartYValue(0, 0)).isCloseTo(4.1 - 1.96 * 1.2, within(1e-12));
        assertThat(band.getEndYValue(1, 1)).isCloseTo(4.7 + 1.96 * 0.9, within(1e-12));
    }

    @Test
    void theCriticalValueLineStaysInsideTheSequencePlot() {
        Chart sequence = new Chart.Sequence("w", "Wald", "break date", "Wald", List.of("1990-01", "1991-01"),
                List.of(1.0, 2.0), 14.13, "5% critical value");
        XYPlot plot = ChartRenderer.build(sequence).getXYPlot();
        assertThat(plot.getRangeAxis().getUpperBound()).isGreaterThan(14.13);
        assertThat(plot.getRangeMarkers(org.jfree.chart.ui.Layer.FOREGROUND)).hasSize(1);
    }

    @Test
    void missingNumbersAndMarkupInLabelsDoNotBreakTheDrawing() {
        Chart scatter = new Chart.Scatter("odd", "S&P <tide>", "implied", "realised", List.of(
                new Chart.Point("A&B", 0.001, 0.002), new Chart.Point("gap", Double.NaN, 0.003),
                new Chart.Point("<C>", 0.004, 0.0035)));
        Chart bars = new Chart.ErrorBars("odd-bars", "bars", "asset", "error", List.of(
                new Chart.Estimate("S1T1", 0.001, Double.NaN), new Chart.Estimate("S1T2", Double.NaN, 0.001)));
        for (Chart chart : List.of(scatter, bars)) {
            Document doc = Jsoup.parse(ChartRenderer.svgDocument(chart, 760, 460), Parser.xmlParser());
            assertThat(doc.select("text").eachText()).contains(chart.title());
            assertThat(ChartRenderer.png(chart, 300, 200)).isNotEmpty();
        }
        Document doc = Jsoup.parse(ChartRenderer.svgDocument(scatter, 760, 460), Parser.xmlParser());
        assertThat(doc.select("text").eachText()).contains("A&B", "<C>").doesNotContain("gap");
    }

    @Test
    void periodLabelsBecomeEvenlySpacedYears() {
        assertThat(ChartRenderer.positions(List.of("1990-01", "1990-07", "1990Q3", "1991")))
                .containsExactly(1990.0, 1990.5, 1990.5, 1991.0);
    }
}
