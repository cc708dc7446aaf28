package org.orthogon.bootstrap;

import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.orthogon.gmm.EstimationException;

/** Counting replications whose refit failed, and refusing a run when too many did. */
final class BootstrapFailures {
    private BootstrapFailures() {
    }

    /** The reasons of the failed replications with their counts, in the order of the reasons' text. */
    static Map<String, Integer> tally(List<String> reasons) {
        Map<String, Integer> counts = new TreeMap<>();
        for (String reason : reasons) {
            if (reason != null) {
                counts.merge(reason, 1, Integer::sum);
            }
        }
        return counts;
    }

    /**
     * Refuses (exit 3) when more than {@link BootstrapPlan#MAX_FAILED_SHARE} of the replications failed:
     * the statistics of the replications that did fit would then be a selected sample, and their
     * p-values would not mean what they say.
     */
    static void refuseIfTooMany(int failed, int replications, Map<String, Integer> reasons, String what) {
        if (failed <= BootstrapPlan.MAX_FAILED_SHARE * replications) {
            return;
        }
        List<String> diagnostics = new java.util.ArrayList<>();
        diagnostics.add(failed + " of " + replications + " replications failed");
        reasons.forEach((reason, count) -> diagnostics.add(count + " x " + reason));
        throw new EstimationException("too many " + what + " replications failed to refit for the result to be "
                + "reported", diagnostics, "use a fixed weight (--method one-step), fewer moments or longer blocks "
                + "(--block-length); failures usually mean the resampled moments do not identify the parameters");
    }

    /** A short reason for a failed refit: the exception's message without its diagnostics. */
    static String reason(RuntimeException e) {
        String message = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
        return message.length() > 160 ? message.substring(0, 157) + "..." : message;
    }
}
