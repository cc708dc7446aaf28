package org.orthogon.moments;

/**
 * A parameter point at which a family's SDF is not defined (for recursive utility: β &le; 0, or ψ = 1).
 * It is an {@link IllegalArgumentException}, so a caller that passes such a point learns which values
 * were wrong; an optimizer that strays there during a search can catch exactly this type and treat
 * the step or the start as failed, without hiding other errors.
 */
public final class ParameterOutOfRangeException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    public ParameterOutOfRangeException(String message) {
        super(message);
    }
}
