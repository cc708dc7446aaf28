package org.orthogon.spec;

import java.util.List;

/**
 * What the model-file reader needs to know about one SDF family before any data is read: its id
 * (the value of {@code family}), the [model] keys it reads beyond {@link ModelCommon#KEYS}, the
 * [data] keys only it uses, and how its keys become its {@link ModelSpec} record. Each family
 * declares one of these beside its record; {@link ModelSpec#FAMILIES} lists them.
 *
 * @param id       the model file's {@code family} value, e.g. "power-utility"
 * @param summary  one line for help texts and messages
 * @param keys     the family's own [model] keys
 * @param dataKeys [data] keys no other family uses (e.g. "wealth")
 * @param reader   reads the family's keys into its record, refusing missing or contradictory ones
 */
public record Family(String id, String summary, List<String> keys, List<String> dataKeys, Reader reader) {
    public Family {
        keys = List.copyOf(keys);
        dataKeys = List.copyOf(dataKeys);
    }

    /** Reads one family's [model] keys. */
    @FunctionalInterface
    public interface Reader {
        /**
         * @param section the [model] section, with located errors
         * @param common  the keys every family reads, already read
         * @throws org.orthogon.data.InputException for a missing or contradictory key
         */
        ModelSpec read(ModelSection section, ModelCommon common);
    }
}
