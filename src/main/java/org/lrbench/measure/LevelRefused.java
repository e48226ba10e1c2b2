package org.lrbench.measure;

/**
 * The bench did not prove its level ({@link LevelCheck}): nothing may be driven at a plan's level on
 * these instruments until the driver or the bench file is put right. Not a verdict on a part: the
 * run ends here, the output off, nothing of the part kept.
 */
public final class LevelRefused extends RuntimeException {
    private static final long serialVersionUID = 1L;
    private final LevelCheck.Result result;

    public LevelRefused(LevelCheck.Result result) {
        super(result.describe() + ". The output is off and nothing was driven at the plan's level: put the driver"
                + " or the bench file right (lrbench exercise --plan PLAN shows what the traces look like)");
        this.result = result;
    }

    public LevelCheck.Result result() {
        return result;
    }
}
