package dev.fray.core.parallel;

/**
 * One worker's growable scratch arrays, kept between steps so the step allocates nothing once warm. Each slot
 * grows lazily (at least doubling) and is never shared between threads.
 */
public final class Workspace {
    /** Kirchhoff stress of a run of particles, 9 per particle. */
    public static final int TAU = 0;
    /** The part of the stress that damage keeps, 9 per particle. */
    public static final int KEPT = 1;
    /** Energy density that damage degrades, 1 per particle. */
    public static final int PSI_DEGRADED = 2;
    /** Energy density that damage keeps, 1 per particle. */
    public static final int PSI_KEPT = 3;
    /** Degradation factor, 1 per particle. */
    public static final int DEGRADATION = 4;
    /** General scratch. */
    public static final int WORK = 5;
    private static final int SLOTS = 6;

    private final double[][] slots = new double[SLOTS][];

    /** Creates the slots (the stress slot starts large enough for a block's particles). */
    public Workspace() {
        for (int i = 0; i < SLOTS; i++) {
            slots[i] = new double[0];
        }
        slots[TAU] = new double[9 * 1024];
    }

    /**
     * @param slot one of the slot constants
     * @param size values needed
     * @return the slot's array, at least {@code size} long (contents unspecified)
     */
    public double[] get(int slot, int size) {
        double[] a = slots[slot];
        if (a.length < size) {
            a = new double[Math.max(size, 2 * a.length)];
            slots[slot] = a;
        }
        return a;
    }
}
