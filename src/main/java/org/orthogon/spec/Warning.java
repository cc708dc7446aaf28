package org.orthogon.spec;

import java.util.Objects;

/**
 * Something a reader must know before trusting a run's numbers, found while the model file and its
 * data were read: a stable code that scripts can match, and the text a person reads.
 *
 * @param code lower-case words joined by hyphens, e.g. "many-moments"; never changes meaning
 * @param text one sentence with the numbers and what to do
 */
public record Warning(String code, String text) {
    public Warning {
        Objects.requireNonNull(text, "text");
        if (!code.matches("[a-z0-9]+(-[a-z0-9]+)*")) {
            throw new IllegalArgumentException("warning code \"" + code + "\" must be lower-case words joined by hyphens");
        }
    }

    /** "[code] text", as the console prints it after "WARNING ". */
    @Override
    public String toString() {
        return "[" + code + "] " + text;
    }
}
