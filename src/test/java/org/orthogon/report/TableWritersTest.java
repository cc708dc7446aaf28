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
        String tex = LatexTables.write(Samples.parameters());
        assertBalanced(tex);
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
        String tex = LatexTables.write(Samples.awkward());
        assertBalanced(tex);
        assertThat(tex).contains("\\caption{Harbour \\& dock 100\\% \"special\" \\#1}")
                .contains("a\\_b \\{c\\} \\textasciitilde{}d \\textasciicircum{}e \\textbackslash{}f \\$g | h, \"q\" & n/a")
                .contains("Costs in \\$ at 5\\% \\& rising; x\\_1 \\textasciitilde{} y\\textasciicircum{}2 "
                        + "\\{braced\\} \\#tag \\textbackslash{} end");
        // Outside the escapes, no special character is left bare in the body.
        String body = tex.substring(tex.indexOf("\\midrule"), tex.indexOf("\\end{table}"))
                .replaceAll("\\\\(textasciitilde|textasciicircum|textbackslash|par|bottomrule|midrule|smallskip|"
                        + "footnotesize|end|begin)(\\{\\})?", "").replaceAll("\\\\[&%$#_{}]", "")
                .replace("\\\\", "").replace(" & ", " ");
        assertThat(body).doesNotContain("%").doesNotContain("$").doesNotContain("#").doesNotContain("_")
                .doesNotContain("~").doesNotContain("^");
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
