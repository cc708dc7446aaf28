package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.io.StringReader;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.Test;

class TableWritersTest {

    @Test
    void csvGuardsFormulaTextButKeepsNegativeNumbersAndFullPrecision() throws IOException {
        String csv = CsvTables.write(Samples.awkward());
        List<CSVRecord> records = CSVFormat.DEFAULT.parse(new StringReader(csv)).getRecords();
        assertThat(records).hasSize(6);
        assertThat(records.get(0).values()).containsExactly("name", "value");
        assertThat(records.get(1).values()).containsExactly("'=SUM(A1:A9)", "-0.5");
        assertThat(records.get(2).values()).containsExactly("'+tide", "1.0E-7");
        assertThat(records.get(3).values()).containsExactly("'-ebb", "3");
        assertThat(records.get(4).values()).containsExactly("'@harbour", "2.25");
        // Commas and quotes survive the round trip; a missing number is an empty cell.
        assertThat(records.get(5).values()).containsExactly("a_b {c} ~d ^e \\f $g | h, \"q\"", "");
    }

    @Test
    void csvKeepsStandardErrorsInTheirOwnColumnAtFullPrecision() throws IOException {
        List<CSVRecord> records = CSVFormat.DEFAULT.parse(new StringReader(CsvTables.write(Samples.parameters())))
                .getRecords();
        assertThat(records.get(0).values()).containsExactly("parameter", "estimate", "std. error", "p-value");
        assertThat(records.get(1).values()).containsExactly("b_TIDE", "4.718808", "1.368757", "5.66E-4");
        assertThat(Double.parseDouble(records.get(1).get(1))).isEqualTo(4.718808);
    }

    @Test
    void latexUsesBooktabsBalancesEnvironmentsAndPutsErrorsUnderEstimates() {
        String tex = LatexTables.write(Samples.parameters(), "lumen-three-factor");
        assertBalanced(tex);
        assertThat(tex).contains("\\label{tab:lumen-three-factor-parameters}")
                .contains("\\resizebox{\\ifdim\\width>\\linewidth\\linewidth\\else\\width\\fi}{!}{%");
        assertThat(tex).contains("\\toprule\nparameter & estimate & p-value \\\\\n\\midrule\n")
                .contains("b\\_TIDE & 4.718808 & 0.0006 \\\\\n & (1.368757) &  \\\\\n")
                .contains("b\\_MKT & -0.500000 & 0.5000 \\\\\n & (n/a) &  \\\\\n\\bottomrule\n")
                .contains("\\begin{tabular}{lrr}")
                .contains("J = 8.535 with 9 degrees of freedom, p-value 0.4813.\\par")
                .doesNotContain("\\hline");
        assertThat(tex.indexOf("\\toprule")).isLessThan(tex.indexOf("\\midrule"));
        assertThat(tex.indexOf("\\midrule")).isLessThan(tex.indexOf("\\bottomrule"));
    }

    @Test
    void latexEscapesEverySpecialCharacter() {
        assertThat(LatexTables.escape("& % $ # _ { } ~ ^ \\"))
                .isEqualTo("\\& \\% \\$ \\# \\_ \\{ \\} \\textasciitilde{} \\textasciicircum{} \\textbackslash{}");
        String tex = LatexTables.write(Samples.awkward(), "run");
        assertBalanced(tex);
        assertThat(tex).contains("\\caption{Harbour \\& dock 100\\% \"special\" \\#1}")
                .contains("a\\_b \\{c\\} \\textasciitilde{}d \\textasciicircum{}e \\textbackslash{}f \\$g \\textbar{} h, \"q\" & n/a")
                .contains("Costs in \\$ at 5\\% \\& rising; x\\_1 \\textasciitilde{} y\\textasciicircum{}2 "
                        + "\\{braced\\} \\#tag \\textbackslash{} end");
        // Outside the escapes, no special character is left bare in the body.
        String body = tex.substring(tex.indexOf("\\midrule"), tex.indexOf("\\end{table}"))
                .replaceAll("\\\\(textasciitilde|textasciicircum|textbackslash|textbar|par|bottomrule|midrule|smallskip|"
                        + "footnotesize|end|begin)(\\{\\})?", "").replaceAll("\\\\[&%$#_{}]", "")
                .replace("\\\\", "").replace(" & ", " ");
        assertThat(body).doesNotContain("%").doesNotContain("$").doesNotContain("#").doesNotContain("_")
                .doesNotContain("~").doesNotContain("^");
    }

    @Test
    void latexSetsParameterNamesAndSymbolsAsMathematics() {
        // Common practice in typesetting, no source: Greek names as letters, factor names as upright subscripts.
        assertThat(LatexTables.symbol("beta")).isEqualTo("$\\beta$");
        assertThat(LatexTables.symbol("gamma")).isEqualTo("$\\gamma$");
        assertThat(LatexTables.symbol("a")).isEqualTo("$a$");
        assertThat(LatexTables.symbol("b_MKT")).isEqualTo("$b_{\\mathrm{MKT}}$");
        assertThat(LatexTables.symbol("mu_SIZE")).isEqualTo("$\\mu_{\\mathrm{SIZE}}$");
        assertThat(LatexTables.symbol("b_MKT*z_growth")).isEqualTo("$b_{\\mathrm{MKT}\\times\\mathrm{z\\_growth}}$");
        assertThat(LatexTables.symbol("theta 2")).isEqualTo("theta 2");
        assertThat(LatexTables.escape("mean |α|")).isEqualTo("mean \\textbar{}$\\alpha$\\textbar{}");
        assertThat(LatexTables.escape("cross-sectional R²")).isEqualTo("cross-sectional R$^{2}$");
        assertThat(LatexTables.escape("χ²")).isEqualTo("$\\chi^{2}$");
        Table table = Table.builder("parameters", "Estimates", "parameter", "estimate")
                .row(Cell.parameter("beta"), Cell.number(0.97)).row(Cell.parameter("b_SIZE"), Cell.number(1.5)).build();
        assertThat(LatexTables.write(table, "m")).contains("$\\beta$ & 0.970000 \\\\\n")
                .contains("$b_{\\mathrm{SIZE}}$ & 1.500000");
        assertThat(MarkdownTables.write(table)).contains("| beta | 0.970000 |");
    }

    @Test
    void aLongTableIsSplitIntoFloatsThatFitAPage() {
        Table.Builder builder = Table.builder("sensitivity", "Many rows", "kernel", "p-value");
        for (int i = 0; i < 2 * LatexTables.FLOAT_LINES + 1; i++) {
            builder.row(Cell.text("bartlett"), Cell.fixed(i / 100.0, 4));
        }
        String tex = LatexTables.write(builder.note("the note").build(), "m");
        assertBalanced(tex);
        assertThat(tex.split("\\\\begin\\{table\\}", -1)).hasSize(4);
        assertThat(tex).contains("\\label{tab:m-sensitivity}\n").contains("\\label{tab:m-sensitivity-2}")
                .contains("\\label{tab:m-sensitivity-3}").contains("\\caption{Many rows (continued)}");
        assertThat(tex.indexOf("the note")).isGreaterThan(tex.lastIndexOf("\\begin{table}"));
        // Rows with a standard error under them take two lines, so half as many fit one float.
        Table.Builder stacked = Table.builder("windows", "Windows", "window", "b", "se b").errorUnder("b", "se b");
        for (int i = 0; i < LatexTables.FLOAT_LINES / 2 + 1; i++) {
            stacked.row(Cell.text("w" + i), Cell.number(1), Cell.number(0.1));
        }
        assertThat(LatexTables.write(stacked.build(), "m").split("\\\\begin\\{table\\}", -1)).hasSize(3);
    }

    @Test
    void markdownStacksErrorsAndEscapesPipes() {
        String md = MarkdownTables.write(Samples.parameters());
        assertThat(md).startsWith("**Tide premium: estimates**\n\n| parameter | estimate | p-value |\n"
                + "| :--- | ---: | ---: |\n| b\\_TIDE | 4.718808 | 0.0006 |\n|  | (1.368757) |  |\n");
        assertThat(MarkdownTables.write(Samples.awkward())).contains("\\$g \\| h, \"q\" | n/a |");
    }

    @Test
    void tablesRefuseRaggedRowsAndBadIds() {
        assertThatThrownBy(() -> Table.builder("x", "c", "a", "b").row(Cell.text("only one")).build())
                .hasMessageContaining("1 cells, the header 2");
        assertThatThrownBy(() -> Table.builder("Bad Id", "c", "a").build()).hasMessageContaining("Bad Id");
        assertThatThrownBy(() -> Table.builder("x", "c", "a", "b", "c").errorUnder("a", "b").errorUnder("a", "c"))
                .hasMessageContaining("at most one");
    }

    /** Every \begin{env} closes with a matching \end{env}, properly nested. */
    static void assertBalanced(String tex) {
        Matcher m = Pattern.compile("\\\\(begin|end)\\{(\\w+)\\}").matcher(tex);
        Deque<String> open = new ArrayDeque<>();
        int seen = 0;
        while (m.find()) {
            seen++;
            if (m.group(1).equals("begin")) {
                open.push(m.group(2));
            } else {
                assertThat(open).as("\\end{%s} without \\begin", m.group(2)).isNotEmpty();
                assertThat(open.pop()).isEqualTo(m.group(2));
            }
        }
        assertThat(open).isEmpty();
        assertThat(seen).isGreaterThanOrEqualTo(4);
        // Braces balance once escaped braces are removed.
        String bare = tex.replace("\\{", "").replace("\\}", "");
        assertThat(bare.chars().filter(c -> c == '{').count()).isEqualTo(bare.chars().filter(c -> c == '}').count());
    }
}
