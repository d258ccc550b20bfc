package dev.fray.core.testing;

import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ParticleStore;

import java.util.Random;

/**
 * The pieces a step phase works on, built outside a simulation so that one phase can be run and checked alone:
 * particles, a sparse grid, the block layout prepared for them (sorted, blocks activated), one stencil per worker and
 * the workers. Close it to stop the workers.
 */
public final class GridFixture implements AutoCloseable {
    /** The particles (sorted by block once constructed). */
    public final ParticleStore store;
    /** The grid, with the blocks the particles reach active. */
    public final SparseGrid grid = new SparseGrid();
    /** The layout, prepared. */
    public final BlockLayout layout;
    /** One stencil per worker. */
    public final Stencil[] stencils;
    /** The workers. */
    public final Workers workers;
    /** The kernel. */
    public final Kernel kernel;
    /** Grid origin x, y, z, m. */
    public final double[] origin;
    /** Cell size, m. */
    public final double dx;

    /**
     * @param store   particles with positions set (sorted in place)
     * @param kernel  interpolation kernel
     * @param origin  grid origin, m
     * @param dx      cell size, m
     * @param threads worker threads
     */
    public GridFixture(ParticleStore store, Kernel kernel, double[] origin, double dx, int threads) {
        this.store = store;
        this.kernel = kernel;
        this.origin = origin.clone();
        this.dx = dx;
        this.workers = new Workers(threads);
        this.layout = new BlockLayout(grid, kernel, origin[0], origin[1], origin[2], dx);
        this.stencils = new Stencil[threads];
        for (int i = 0; i < threads; i++) {
            stencils[i] = new Stencil(kernel, origin[0], origin[1], origin[2], dx);
        }
        layout.prepare(store, workers);
    }

    /**
     * Particles at uniform random positions in a box, each with a random mass in [0.5, 1.5] mg and the volume of
     * that mass at 1000 kg/m^3.
     *
     * @param rand the generator
     * @param n    number of particles
     * @param lo   smallest coordinate on every axis, m
     * @param hi   largest coordinate on every axis, m
     * @return the store
     */
    public static ParticleStore randomParticles(Random rand, int n, double lo, double hi) {
        ParticleStore s = new ParticleStore(n);
        double[] x = s.position();
        for (int i = 0; i < 3 * n; i++) {
            x[i] = lo + (hi - lo) * rand.nextDouble();
        }
        for (int p = 0; p < n; p++) {
            s.mass()[p] = 1e-6 * (0.5 + rand.nextDouble());
            s.volume()[p] = s.mass()[p] / 1000;
        }
        return s;
    }

    /**
     * Position of a grid node from the block coordinates, independent of the solver's own arithmetic:
     * node = 64 block + 16 lx + 4 ly + lz sits at origin + (4 blockCoord + l) dx.
     *
     * @param node the node
     * @param out  (output) x, y, z, m
     */
    public void nodePosition(int node, double[] out) {
        int b = node / SparseGrid.NODES_PER_BLOCK;
        int l = node % SparseGrid.NODES_PER_BLOCK;
        int[] c = grid.blockCoords();
        out[0] = origin[0] + (4 * c[3 * b] + l / 16) * dx;
        out[1] = origin[1] + (4 * c[3 * b + 1] + (l / 4) % 4) * dx;
        out[2] = origin[2] + (4 * c[3 * b + 2] + l % 4) * dx;
    }

    @Override
    public void close() {
        workers.close();
    }
}
