package dev.fray.core.error;

/**
 * The simulation produced a non-finite value or a runaway speed. Carries where it happened and a suggested fix.
 */
public class SimulationDivergedException extends IllegalStateException implements FrayError {
    private static final long serialVersionUID = 1L;
    private final Object[] parts;
    private final long step;
    private final double time;
    private final int particleId;
    private final String body;

    /**
     * @param reason     what went wrong, e.g. "NaN velocity"
     * @param body       name of the body the particle belongs to
     * @param particleId stable particle id (index at creation)
     * @param step       step number (0-based) in which it happened
     * @param time       simulated time at the start of that step, s
     * @param fix        a suggested fix
     */
    public SimulationDivergedException(String reason, String body, int particleId, long step, double time, String fix) {
        super(FrayMessage.DIVERGED.format(reason, body, particleId, step, time, fix));
        this.parts = new Object[] {reason, body, particleId, step, time, fix};
        this.step = step;
        this.time = time;
        this.particleId = particleId;
        this.body = body;
    }

    @Override
    public FrayMessage key() {
        return FrayMessage.DIVERGED;
    }

    @Override
    public Object[] parts() {
        return parts.clone();
    }

    /** @return step number in which the divergence was detected */
    public long step() {
        return step;
    }

    /** @return simulated time at the start of that step, s */
    public double time() {
        return time;
    }

    /** @return stable id of the offending particle */
    public int particleId() {
        return particleId;
    }

    /** @return name of the offending particle's body */
    public String body() {
        return body;
    }
}
