package org.lrbench.store;

import java.util.List;

/** A lot run that the stored lot refuses: other terms than those it started with, or a re-inspection of an open lot. */
public final class LotTermsException extends StoreException {
    private static final long serialVersionUID = 1L;

    private final List<String> differences;

    public LotTermsException(String message, List<String> differences) {
        super(message, null);
        this.differences = List.copyOf(differences);
    }

    public List<String> differences() {
        return differences;
    }
}
