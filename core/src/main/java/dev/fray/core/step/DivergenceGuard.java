package dev.fray.core.step;

import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Scene;
import dev.fray.core.transfer.GridToParticle;

import java.util.List;

/**
 * Checks the state after each gather: a particle with a non-finite velocity or deformation, a speed above the
 * scene's limit, or a particle that moved more than a cell in one step stops the run with a
 * {@link SimulationDivergedException} naming the body, the particle, the step and the time, and a fix. Reads the
 * per-block results of the gather in block order, so the particle named is the same for any thread count.
 */
public final class DivergenceGuard {
    private final Scene scene;
    private final double dx;
    private final double speedLimit;

    /**
     * @param scene      the scene
     * @param speedLimit particle speed at which the run stops, m/s
     */
    public DivergenceGuard(Scene scene, double speedLimit) {
        this.scene = scene;
        this.dx = scene.cellSize();
        this.speedLimit = speedLimit;
    }

    /** @return particle speed at which the run stops, m/s */
    public double speedLimit() {
        return speedLimit;
    }

    /**
     * @param g2p    the gather just run
     * @param layout the particle blocks
     * @param store  the particles
     * @param names  body names
     * @param h      the step, s
     * @param step   the step's index
     * @param time   the step's start time, s
     * @return the largest particle speed, m/s
     */
    public double check(GridToParticle g2p, BlockLayout layout, ParticleStore store, List<String> names, double h,
                        long step, double time) {
        double fastest = 0;
        int fastestP = -1;
        for (int r = 0; r < layout.blockCount(); r++) {
            if (g2p.blockBad(r) >= 0) {
                int p = g2p.blockBad(r);
                throw new SimulationDivergedException("non-finite velocity or deformation, or a failed return mapping",
                        names.get(store.body()[p]), store.id()[p], step, time, suggestion());
            }
            if (g2p.blockMaxSpeed(r) > fastest) {
                fastest = g2p.blockMaxSpeed(r);
                fastestP = g2p.blockFastest(r);
            }
        }
        if (fastest > speedLimit) {
            throw new SimulationDivergedException("speed " + fastest + " m/s above the limit " + speedLimit
                    + " m/s", names.get(store.body()[fastestP]), store.id()[fastestP], step, time, suggestion());
        }
        if (fastest * h > dx) {
            throw new SimulationDivergedException("particle moved " + fastest * h / dx + " cells in one step",
                    names.get(store.body()[fastestP]), store.id()[fastestP], step, time,
                    Double.isNaN(scene.fixedTimeStep()) ? "use a smaller cfl (now " + scene.cfl()
                            + ") or maxTimeStep" : "use a smaller fixedTimeStep or the adaptive step");
        }
        return fastest;
    }

    /** @return what to try after a divergence, in the scene's own terms */
    public String suggestion() {
        String step = Double.isNaN(scene.fixedTimeStep())
                ? "try a smaller cfl (now " + scene.cfl() + "), a smaller maxTimeStep"
                : "try a smaller fixedTimeStep (now " + scene.fixedTimeStep() + " s)";
        return step + ", softer or denser material, or check for bodies that start overlapping obstacles";
    }
}
