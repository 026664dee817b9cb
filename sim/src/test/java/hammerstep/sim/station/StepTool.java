package hammerstep.sim.station;

/**
 * A plain tool model for tests: while trigger and enable are on it strikes every {@code intervalMs},
 * each blow a 2 ms half-sine whose peak climbs by {@code stepNm} per blow up to {@code maxNm}; each
 * position's fastener keeps its torque between passes.
 */
final class StepTool implements ToolModel {

    private final double rateHz;
    private final double stepNm;
    private final double maxNm;
    private final long intervalSamples;
    private final double[] heldNm;
    private final int[] blowsAt;
    private int at;
    private boolean trigger;
    private boolean enabled;
    private long sample;
    private long blowStart = Long.MIN_VALUE / 2;
    private long nextBlow;
    private double peak;

    StepTool(int positions, double rateHz, double stepNm, double maxNm, double blowsPerMin) {
        this.rateHz = rateHz;
        this.stepNm = stepNm;
        this.maxNm = maxNm;
        this.intervalSamples = (long) (rateHz * 60 / blowsPerMin);
        this.heldNm = new double[positions];
        this.blowsAt = new int[positions];
    }

    @Override
    public void setTrigger(boolean pulled) {
        trigger = pulled;
    }

    @Override
    public void setEnabled(boolean on) {
        enabled = on;
    }

    @Override
    public void fill(float[] out, int offset, int length) {
        long width = (long) (0.002 * rateHz);
        for (int i = 0; i < length; i++, sample++) {
            if (trigger && enabled && sample >= nextBlow) {
                blowStart = sample;
                nextBlow = sample + intervalSamples;
                peak = Math.min(maxNm, heldNm[at] + stepNm);
                heldNm[at] = Math.max(heldNm[at], peak * 0.9);
                blowsAt[at]++;
            }
            long k = sample - blowStart;
            out[offset + i] = k >= 0 && k < width ? (float) (peak * Math.sin(Math.PI * k / width)) : 0f;
        }
        if (!(trigger && enabled)) {
            nextBlow = Math.max(nextBlow, sample);
        }
    }

    @Override
    public void moveTo(int index) {
        at = index;
    }

    @Override
    public void newPart() {
        java.util.Arrays.fill(heldNm, 0);
        java.util.Arrays.fill(blowsAt, 0);
    }

    @Override
    public int blows() {
        return blowsAt[at];
    }

    @Override
    public double residualTorqueNm() {
        return heldNm[at];
    }
}
