package dev.fray.core.step;

import dev.fray.core.boundary.GridBoundaries;
import dev.fray.core.boundary.ParticleObstacleContact;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.parallel.Workers;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Scene;
import dev.fray.core.transfer.FieldRouting;

import java.util.List;

/**
 * What the phases of a step share: the scene, the particles, the grid and its layout, the velocity fields and their
 * routing, the boundaries, the workers with their stencils and workspaces, the laws and damage models per body, and
 * the run's clock and energy tallies. One per simulation; the phases read it and the integrator advances it.
 */
public final class StepContext {
    /** Name of the particle channel holding the index of the grip that holds a particle (-1 none). */
    public static final String GRIP_CHANNEL = dev.fray.core.particles.ParticleSampler.GRIP_CHANNEL;

    private final Scene scene;
    private final ParticleStore store;
    private final SparseGrid grid;
    private final BlockLayout layout;
    private final FieldSet fields;
    private final FieldRouting routing;
    private final GridBoundaries boundaries;
    private final ParticleObstacleContact particleContact;
    private final Workers workers;
    private final Stencil[] stencils;
    private final Workspace[] workspaces;
    private final MaterialLaw[] laws;
    private final DamageModel[] damage;
    private final List<String> bodyNames;
    private final double[] origin;
    private final Tallies tallies;
    /** Start time of the current step, s. */
    double time;
    /** Steps taken. */
    long step;

    /**
     * @param scene      the scene
     * @param store      the particles
     * @param grid       the grid
     * @param layout     the particle blocks
     * @param fields     the velocity fields per node
     * @param routing    which field each particle feeds
     * @param boundaries walls, obstacles and grips
     * @param particleContact particle-level obstacle contact
     * @param workers    the workers
     * @param laws       material law per body
     * @param damage     damage model per body (null entries: none)
     * @param bodyNames  body names, for messages
     * @param stencils   one stencil per worker
     */
    public StepContext(Scene scene, ParticleStore store, SparseGrid grid, BlockLayout layout, FieldSet fields,
                       FieldRouting routing, GridBoundaries boundaries, ParticleObstacleContact particleContact,
                       Workers workers, MaterialLaw[] laws, DamageModel[] damage, List<String> bodyNames,
                       Stencil[] stencils) {
        this.scene = scene;
        this.store = store;
        this.grid = grid;
        this.layout = layout;
        this.fields = fields;
        this.routing = routing;
        this.boundaries = boundaries;
        this.particleContact = particleContact;
        this.workers = workers;
        this.laws = laws;
        this.damage = damage;
        this.bodyNames = bodyNames;
        this.origin = new double[] {scene.domain().minX(), scene.domain().minY(), scene.domain().minZ()};
        this.stencils = stencils;
        this.workspaces = new Workspace[workers.threads()];
        for (int i = 0; i < workspaces.length; i++) {
            workspaces[i] = new Workspace();
        }
        this.tallies = new Tallies(boundaries.gripCount(), boundaries.obstacleCount());
    }

    /** @return the scene */
    public Scene scene() {
        return scene;
    }

    /** @return the particles */
    public ParticleStore store() {
        return store;
    }

    /** @return the grid */
    public SparseGrid grid() {
        return grid;
    }

    /** @return the particle blocks */
    public BlockLayout layout() {
        return layout;
    }

    /** @return the velocity fields per node */
    public FieldSet fields() {
        return fields;
    }

    /** @return which field each particle feeds */
    public FieldRouting routing() {
        return routing;
    }

    /** @return walls, obstacles and grips */
    public GridBoundaries boundaries() {
        return boundaries;
    }

    /** @return particle-level obstacle contact */
    public ParticleObstacleContact particleContact() {
        return particleContact;
    }

    /** @return the workers */
    public Workers workers() {
        return workers;
    }

    /**
     * @param scene   the scene (kernel, grid origin and cell size)
     * @param threads number of workers
     * @return one new stencil per worker
     */
    public static Stencil[] stencils(Scene scene, int threads) {
        Stencil[] s = new Stencil[threads];
        for (int i = 0; i < threads; i++) {
            s[i] = new Stencil(scene.kernel(), scene.domain().minX(), scene.domain().minY(), scene.domain().minZ(),
                    scene.cellSize());
        }
        return s;
    }

    /** @return one stencil per worker */
    public Stencil[] stencils() {
        return stencils;
    }

    /** @return one workspace per worker */
    public Workspace[] workspaces() {
        return workspaces;
    }

    /** @return material law per body */
    public MaterialLaw[] laws() {
        return laws;
    }

    /** @return damage model per body, null where a body has none */
    public DamageModel[] damage() {
        return damage;
    }

    /** @return body names */
    public List<String> bodyNames() {
        return bodyNames;
    }

    /** @return grid origin (x, y, z), m (do not modify) */
    public double[] origin() {
        return origin;
    }

    /** @return the run's energy and boundary tallies */
    public Tallies tallies() {
        return tallies;
    }

    /** @return start time of the current step (the simulation time between steps), s */
    public double time() {
        return time;
    }

    /** @return steps taken */
    public long step() {
        return step;
    }

    /**
     * Sets the clock (when a run is restored).
     *
     * @param time simulated time, s
     * @param step steps taken
     */
    public void setClock(double time, long step) {
        this.time = time;
        this.step = step;
    }

    /** @return grip index per particle (-1 none), or null if the scene has no grip */
    public double[] gripOf() {
        return scene.grips().isEmpty() ? null : store.channel(GRIP_CHANNEL);
    }
}
