package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;

import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.Test;

class HtmlReportTest {
    private final Report report = Samples.report();
    private final String html = Html.write(report);
    private final Document page = Jsoup.parse(html);

    @Test
    void everyTableIsThereWithItsCellsAndErrorsUnderEstimates() {
        for (Table table : report.tables()) {
            Element figure = page.getElementById("table-" + table.id());
            assertThat(figure).as(table.id()).isNotNull();
            assertThat(figure.selectFirst("figcaption").text()).isEqualTo(table.caption());
            assertThat(figure.select("table")).hasSize(1);
        }
        Element parameters = page.getElementById("table-parameters");
        assertThat(parameters.select("thead th").eachText()).containsExactly("parameter", "estimate", "p-value");
        assertThat(parameters.select("tbody tr")).hasSize(4);
        assertThat(parameters.select("tbody tr").get(0).select("td").eachText())
                .containsExactly("b_TIDE", "4.718808", "0.0006");
        assertThat(parameters.select("tbody tr").get(1).select("td").stream().map(Element::text))
                .containsExactly("", "(1.368757)", "");
        assertThat(parameters.select("tbody tr").get(1).hasClass("se")).isTrue();
        assertThat(page.getElementById("table-awkward").select("td").first().text()).isEqualTo("=SUM(A1:A9)");
    }

    @Test
    void everyChartIsAnInlineSvgWithRealText() {
        assertThat(page.select("figure.chart")).hasSize(report.charts().size());
        for (Chart chart : report.charts()) {
            Element figure = page.getElementById("chart-" + chart.id());
            assertThat(figure).as(chart.id()).isNotNull();
            Element svg = figure.selectFirst("svg");
            assertThat(svg).as(chart.id()).isNotNull();
            // Square where a 45-degree line is drawn, so the line is at 45 degrees; wide otherwise.
            assertThat(svg.attr("viewBox")).isEqualTo(chart instanceof Chart.Scatter ? "0 0 560 560" : "0 0 760 460");
            assertThat(svg.select("text").eachText()).as(chart.id()).contains(chart.yLabel(), chart.xLabel());
        }
        assertThat(page.getElementById("chart-realised-vs-implied").select("text").eachText()).contains("S1T1", "S3T4");
        assertThat(page.getElementById("chart-sup-wald").select("text").eachText())
                .contains("5% critical value 14.13");
    }

    @Test
    void nothingIsFetchedFromAnywhere() {
        assertThat(html).doesNotContainIgnoringCase("http").doesNotContainIgnoringCase("<script")
                .doesNotContainIgnoringCase("<link").doesNotContainIgnoringCase("@import")
                .doesNotContainIgnoringCase("@font-face");
        assertThat(page.select("script, link, img, iframe, object, embed, source")).isEmpty();
        assertThat(page.select("[src]")).isEmpty();
        for (Element element : page.select("[href], [xlink:href]")) {
            assertThat(element.attr("href") + element.attr("xlink:href")).startsWith("#");
        }
        // CSS and SVG may only point inside the page.
        assertThat(html.replaceAll("url\\(#[\\w-]+\\)", "")).doesNotContain("url(");
        // Ids are unique, so the charts' clip paths cannot capture one another.
        var ids = page.select("[id]").eachAttr("id");
        assertThat(ids).doesNotHaveDuplicates();
    }

    @Test
    void titleWarningsAndCautionAreShownAndEscaped() {
        assertThat(page.title()).isEqualTo("Lumen <three-factor> & tide");
        assertThat(page.selectFirst("h1").text()).isEqualTo("Lumen <three-factor> & tide");
        assertThat(html).contains("Lumen &lt;three-factor&gt; &amp; tide");
        assertThat(page.select(".warnings li").eachText()).containsExactly("K = 12 moments against T = 60 observations");
        assertThat(page.selectFirst("footer").text()).isEqualTo(Caution.TEXT);
    }
}
