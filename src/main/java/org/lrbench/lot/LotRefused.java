package org.lrbench.lot;

/**
 * A lot run refused before anything was measured, with what kind of refusal it is, so that each
 * caller answers in its own terms (the command line with exit code 2, the service with 400 or 409).
 */
public final class LotRefused extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** Why a lot may not start. */
    public enum Kind {
        /** The request itself is wrong: a name, a size, a plan without sampling, a plan the bench cannot play. */
        BAD_INPUT,
        /** The request is sound but the lot's state forbids it: other terms, an open inspection, a discontinued scheme. */
        CONFLICT,
        /** The bench's check standard or corrections refuse the lot; an override with a reason starts it anyway. */
        CHECK_REFUSED,
        /** Another run holds the lot (it is measuring it now): the message names it. */
        HELD
    }

    private final Kind kind;

    public LotRefused(Kind kind, String message) {
        super(message);
        this.kind = kind;
    }

    public Kind kind() {
        return kind;
    }
}
