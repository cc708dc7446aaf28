package org.orthogon.spec;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.data.InputException;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;

class ModelFileTest {
    @TempDir
    Path folder;

    private Path write(String text) throws IOException {
        Path file = folder.resolve("model.toml");
        Files.writeString(file, text);
        return file;
    }

    private InputException refusal(String text) throws IOException {
        Path file = write(text);
        return catchThrowableOfType(InputException.class, () -> ModelFile.read(file));
    }

    private static final String MINIMAL = "[data]\nreturns = \"r.csv\"\n\n[model]\nfamily = \"linear-factor\"\n"
            + "factor_columns = [\"MKT\"]\n";

    @Test
    void readsTheShippedPowerUtilityFile() {
        RunSpec spec = ModelFile.read(Paths.get("models/lumen-power-utility.toml"));
        assertThat(spec.title()).isEqualTo("Power utility on the Lumen size/tide portfolios");
        assertThat(spec.model().family()).isSameAs(PowerUtilitySpec.FAMILY);
        assertThat(spec.model()).isInstanceOfSatisfying(PowerUtilitySpec.class,
                power -> assertThat(power.consumption().growthColumn()).contains("cons_growth"));
        assertThat(spec.model().startValues()).containsEntry("beta", 0.99).containsEntry("gamma", 2.0);
        assertThat(spec.estimation().method()).isEqualTo(EstimationMethod.TWO_STEP);
        assertThat(spec.estimation().kernel()).isEqualTo(Kernel.BARTLETT);
        assertThat(spec.estimation().bandwidth()).isEqualTo(new BandwidthRule.Lags(4));
        assertThat(spec.data().returns()).isEqualTo(Paths.get("demo-data/lumen-portfolios-monthly.csv").toAbsolutePath());
        assertThat(spec.lineOf("data", "macro")).isEqualTo(10);
    }

    @Test
    void defaultsApplyWhenEstimationIsOmitted() throws IOException {
        RunSpec spec = ModelFile.read(write(MINIMAL));
        assertThat(spec.title()).isEqualTo("model");
        assertThat(spec.data().returnsKind()).isEqualTo(org.orthogon.data.ReturnKind.GROSS);
        assertThat(spec.data().units()).isEqualTo(org.orthogon.data.Units.DECIMAL);
        assertThat(spec.estimation().method()).isEqualTo(EstimationMethod.TWO_STEP);
        assertThat(spec.estimation().centered()).isTrue();
        assertThat(spec.estimation().prewhiten()).isFalse();
    }

    @Test
    void defaultLongRunCovarianceDependsOnTheFamily() throws IOException {
        // Euler-equation families: HC (their one-period errors are martingale differences, docs/methods.md);
        // others Bartlett with 4 lags; lags without a kernel mean Bartlett.
        String power = "[data]\nreturns = \"r.csv\"\nmacro = \"c.csv\"\n\n[model]\nfamily = \"power-utility\"\n"
                + "consumption_column = \"c\"\nstart_values = { beta = 0.99, gamma = 2.0 }\n";
        RunSpec euler = ModelFile.read(write(power));
        assertThat(euler.estimation().kernel()).isEqualTo(Kernel.NONE);
        RunSpec withLags = ModelFile.read(write(power + "\n[estimation]\nlags = 2\n"));
        assertThat(withLags.estimation().kernel()).isEqualTo(Kernel.BARTLETT);
        assertThat(withLags.estimation().bandwidth()).isEqualTo(new BandwidthRule.Lags(2));
        RunSpec linear = ModelFile.read(write(MINIMAL));
        assertThat(linear.estimation().kernel()).isEqualTo(Kernel.BARTLETT);
        assertThat(linear.estimation().bandwidth()).isEqualTo(new BandwidthRule.Lags(4));
    }

    @Test
    void unknownKeyNamesItsLineAndTheClosestKnownKey() throws IOException {
        InputException e = refusal(MINIMAL + "\n[estimation]\nmethd = \"two-step\"\n");
        assertThat(e.line()).isEqualTo(9);
        assertThat(e.getMessage()).contains("unknown key \"methd\"").contains("did you mean \"method\"");
    }

    @Test
    void unknownTopLevelSection() throws IOException {
        InputException e = refusal(MINIMAL + "\n[estimatoin]\nmethod = \"two-step\"\n");
        assertThat(e.line()).isEqualTo(8);
        assertThat(e.getMessage()).contains("estimatoin").contains("did you mean \"estimation\"");
    }

    @Test
    void wrongTypeIsRefused() throws IOException {
        InputException e = refusal(MINIMAL + "\n[estimation]\nprewhiten = \"yes\"\n");
        assertThat(e.line()).isEqualTo(9);
        assertThat(e.getMessage()).contains("prewhiten must be true or false");
    }

    @Test
    void missingSectionIsRefused() throws IOException {
        InputException e = refusal("[data]\nreturns = \"r.csv\"\n");
        assertThat(e.getMessage()).contains("no [model] section").contains("family");
    }

    @Test
    void syntaxErrorNamesTheLine() throws IOException {
        InputException e = refusal("[data]\nreturns = \"r.csv\n[model]\n");
        assertThat(e.line()).isEqualTo(2);
        assertThat(e.getMessage()).contains("not valid TOML");
    }

    @Test
    void nonUtf8BytesAreRefusedWithTheirLine() throws IOException {
        Path file = folder.resolve("latin1.toml");
        byte[] head = "[data]\nreturns = \"r.csv\"\n# caf".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        byte[] bytes = java.util.Arrays.copyOf(head, head.length + 2);
        bytes[head.length] = (byte) 0xE9;
        bytes[head.length + 1] = '\n';
        Files.write(file, bytes);
        InputException e = catchThrowableOfType(InputException.class, () -> ModelFile.read(file));
        assertThat(e.line()).isEqualTo(3);
        assertThat(e.getMessage()).contains("not UTF-8");
    }

    @Test
    void lagsAndBandwidthTogetherAreRefused() throws IOException {
        InputException e = refusal(MINIMAL + "\n[estimation]\nlags = 4\nbandwidth = 5.0\n");
        assertThat(e.getMessage()).contains("both bandwidth and lags");
    }

    @Test
    void bandwidthAcceptsANumberOrARuleName() throws IOException {
        assertThat(ModelFile.read(write(MINIMAL + "\n[estimation]\nbandwidth = 3.5\n")).estimation().bandwidth())
                .isEqualTo(new BandwidthRule.Fixed(3.5));
        assertThat(ModelFile.read(write(MINIMAL + "\n[estimation]\nbandwidth = \"andrews\"\n")).estimation().bandwidth())
                .isEqualTo(new BandwidthRule.Andrews());
        InputException e = refusal(MINIMAL + "\n[estimation]\nbandwidth = \"auto\"\n");
        assertThat(e.line()).isEqualTo(9);
    }

    @Test
    void unknownFamilySuggestsTheClosest() throws IOException {
        InputException e = refusal("[data]\nreturns = \"r.csv\"\n[model]\nfamily = \"power-utlity\"\n");
        assertThat(e.line()).isEqualTo(4);
        assertThat(e.getMessage()).contains("did you mean \"power-utility\"");
    }

    @Test
    void aFolderIsNotAModelFile() {
        InputException e = catchThrowableOfType(InputException.class, () -> ModelFile.read(folder));
        assertThat(e.getMessage()).contains("folder");
    }
}
