package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Random;
import org.junit.jupiter.api.Test;

/** The character-by-character number check accepts exactly what the documented pattern accepts. */
class PlainNumberTest {

    @Test
    void agreesWithThePatternOnEdgeCases() {
        for (String cell : new String[] {"0", "-0", "+1", "1.", ".5", "-.5", "1e3", "1E-3", "1.5e+7", "0.0123",
            "", "+", "-", ".", "e5", "1e", "1e+", "1.2.3", "1,5", "--1", "1e5.5", " 1", "1 ", "NaN", "inf",
            "0x10", "1f", "1d", "١٢", "12%"}) {
            assertThat(CsvSeries.isPlainNumber(cell)).as("\"%s\"", cell)
                    .isEqualTo(CsvSeries.NUMBER.matcher(cell).matches());
        }
    }

    @Test
    void agreesWithThePatternOnRandomCells() {
        // seeded strings over the characters that matter to the grammar
        String alphabet = "0123456789+-.eE ,x";
        Random random = new Random(20250601L);
        for (int n = 0; n < 200_000; n++) {
            int length = random.nextInt(8);
            StringBuilder cell = new StringBuilder();
            for (int i = 0; i < length; i++) {
                cell.append(alphabet.charAt(random.nextInt(alphabet.length())));
            }
            String text = cell.toString();
            assertThat(CsvSeries.isPlainNumber(text)).as("\"%s\"", text)
                    .isEqualTo(CsvSeries.NUMBER.matcher(text).matches());
        }
    }
}
