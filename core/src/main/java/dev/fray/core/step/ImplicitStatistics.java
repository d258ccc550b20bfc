package dev.fray.core.step;

/**
 * Running counts of the implicit integrator's work, for diagnostics and benchmarks: steps, Newton iterations,
 * conjugate-gradient iterations, steps halved because Newton did not converge, and steps whose last halving still
 * did not converge (taken as they were). Read between steps; the integrator owns and updates it.
 */
public final class ImplicitStatistics {
    long steps;
    long newton;
    long cg;
    long halvings;
    long unconverged;
    int lastNewton;
    int lastCg;

    /** @return steps taken (a halved step counts once) */
    public long steps() {
        return steps;
    }

    /** @return Newton iterations, summed over steps */
    public long newtonIterations() {
        return newton;
    }

    /** @return conjugate-gradient iterations, summed over Newton iterations */
    public long cgIterations() {
        return cg;
    }

    /** @return how many times a step was halved and retried */
    public long halvings() {
        return halvings;
    }

    /** @return steps (or halves) taken without meeting the stopping rule after the last halving */
    public long unconverged() {
        return unconverged;
    }

    /** @return Newton iterations of the last solve */
    public int lastNewtonIterations() {
        return lastNewton;
    }

    /** @return conjugate-gradient iterations of the last Newton iteration */
    public int lastCgIterations() {
        return lastCg;
    }

    @Override
    public String toString() {
        return "steps " + steps + ", newton " + newton + ", cg " + cg + ", halvings " + halvings
                + ", unconverged " + unconverged;
    }
}
