package org.orthogon.longrun;

/**
 * The data at hand admit no long-run covariance estimate with the options chosen: too few
 * observations for an automatic bandwidth or for prewhitening, a moment column that does not move,
 * a bandwidth rule that returns no finite number, a VAR(1) whose I - A cannot be inverted, or
 * moments that are not finite. The options themselves are valid ({@link LongRunOptions} refuses
 * invalid ones when it is built); a caller reports this as a failed estimation, not as a bug.
 */
public final class LongRunException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public LongRunException(String message) {
        super(message);
    }

    /** What a user can change to get an estimate. */
    public String fix() {
        return "choose another bandwidth rule (a fixed bandwidth or lag count), switch prewhitening off, or use a "
                + "longer sample";
    }
}
