package org.orthogon.spec;

import java.util.List;
import java.util.Map;
import org.orthogon.moments.Payoff;

/**
 * The [model] section of a model file: one record per SDF family, each carrying its own keys, and
 * the keys every family reads ({@link ModelCommon}: instruments, start values, bounds). A family's
 * record also assembles its moment conditions from the data ({@link #assemble}), so everything a
 * family means lives in its own file.
 *
 * <p>Adding a family: a moments class in {@code org.orthogon.moments} (usually an
 * {@link org.orthogon.moments.SdfErrors}), a record here with its {@link Family} descriptor, tests, and
 * one registration: the record in the {@code permits} clause and its descriptor in {@link #FAMILIES}.
 */
public sealed interface ModelSpec permits PowerUtilitySpec, RecursiveUtilitySpec, LinearFactorSpec, ExpressionSpec {

    /** Every family the model file can name, in the order help texts list them. */
    List<Family> FAMILIES = List.of(PowerUtilitySpec.FAMILY, RecursiveUtilitySpec.FAMILY, LinearFactorSpec.FAMILY,
            ExpressionSpec.FAMILY);

    /** This family's descriptor. */
    Family family();

    /** The keys every family reads. */
    ModelCommon common();

    /** What the moments price: gross returns (E[m R] = 1) or excess returns (E[m R^e] = 0). */
    Payoff payoff();

    /**
     * Reads, checks and aligns the family's data with {@code data} and builds its pricing errors,
     * with the family's default start values.
     *
     * @throws org.orthogon.data.InputException for missing or unusable data, naming the file and line
     */
    FamilyModel assemble(DataLoader data);

    /**
     * Bounds the family imposes unless the model file says otherwise, by parameter name (the
     * consumption families keep β above zero, where their SDF is defined).
     */
    default Map<String, double[]> defaultBounds() {
        return Map.of();
    }

    /**
     * The economic ranges of the family's parameters; an estimate outside one is not a clean estimate
     * ({@link org.orthogon.gmm.IdentificationDiagnostics}). None by default: factor prices take any sign.
     */
    default List<org.orthogon.gmm.IdentificationDiagnostics.Range> economicRanges() {
        return List.of();
    }

    /**
     * True when the family's moments are one-period pricing errors that its null makes martingale differences
     * (Euler equations E_{t-1}[m_t R_t] = 1), so that S has no autocovariances under the null and the
     * heteroskedasticity-consistent S is the default (docs/methods.md, "Many moments"). False by default: an
     * unconditional restriction E[m R] = p does not rule out serial correlation.
     */
    default boolean martingaleDifferenceErrors() {
        return false;
    }

    /** Every instrument column the family reads from the [data] instruments file. */
    default List<String> instrumentsNeeded() {
        return common().instrumentColumns();
    }

    /** The [model] key to name when an instrument column is missing. */
    default String instrumentsKey() {
        return "instrument_columns";
    }

    /** The instrument columns that scale the moments ("const" for a column of ones). */
    default List<String> instrumentColumns() {
        return common().instrumentColumns();
    }

    /** Start values given in the model file, by parameter name. */
    default Map<String, Double> startValues() {
        return common().startValues();
    }

    /** Bounds given in the model file, by parameter name. */
    default Map<String, double[]> bounds() {
        return common().bounds();
    }

    /** The family with the model file's {@code family} value, or null. */
    static Family family(String id) {
        return FAMILIES.stream().filter(f -> f.id().equals(id)).findFirst().orElse(null);
    }
}
