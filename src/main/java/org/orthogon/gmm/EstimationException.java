package org.orthogon.gmm;

import java.util.List;

/**
 * Estimation could not produce an estimate worth reporting: the solver did not converge, the
 * parameters are not identified (D'WD singular), or S cannot be inverted. Carries the diagnostics and
 * the suggested fix; the command line prints them and exits with code 3.
 */
public final class EstimationException extends RuntimeException {
    private static final long serialVersionUID = 1L;
    private final List<String> diagnostics;
    private final String fix;

    public EstimationException(String problem, List<String> diagnostics, String fix) {
        super(problem);
        this.diagnostics = List.copyOf(diagnostics);
        this.fix = fix;
    }

    public List<String> diagnostics() {
        return diagnostics;
    }

    public String fix() {
        return fix;
    }
}
