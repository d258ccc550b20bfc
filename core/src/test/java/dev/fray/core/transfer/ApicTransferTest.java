package dev.fray.core.transfer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.ParticleObstacleContact;
import dev.fray.core.boundary.WallHold;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.RunOptions;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import dev.fray.core.testing.SimpleNeoHookean;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

import java.util.List;

/**
 * APIC transfers (Jiang et al., <i>The affine particle-in-cell method</i>, ACM TOG 34(4), 2015; VALIDATION.md B11)
 * with the MLS force term (Hu et al., ACM TOG 37(4), 2018), checked one transfer at a time and over a whole run.
 */
class ApicTransferTest extends FrayTestBase {
    private static final double DX = 0.05;
    private static final double[] ORIGIN = {0.05, -0.1, 0.02};
    private static final int N = 400;
    private static final double EXACT = 1e-12;

    /**
     * One P2G conserves mass, linear momentum and angular momentum: sum m_i = sum m_p, sum m_i v_i = sum m_p v_p,
     * and sum x_i x m_i v_i = sum (x_p x m_p v_p + m_p D eps:C_p^T), D the kernel's inertia scale. Published: Jiang
     * et al. 2015 (the affine spin term and its exact transfer). With a stress source the MLS force term
     * -h V D^-1 tau (x_i - x_p) adds no momentum and the torque -h V eps:tau, which vanishes for the symmetric stress
     * of every objective law (follows from the B-spline moments sum w d = 0, sum w d d^T = D I; common practice, no
     * source). A non-symmetric random tau is used here so the torque term is exercised too.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void scatterConservesMassMomentumAndAngularMomentum(Kernel kernel) {
        try (GridFixture fx = randomCloud(kernel, 2)) {
            double h = 1e-3;
            double[] tau = new double[9 * N];
            for (int i = 0; i < tau.length; i++) {
                tau[i] = 1e4 * (2 * rand.nextDouble() - 1);
            }
            for (boolean stressed : new boolean[] {false, true}) {
                double[] particle = particleTotals(fx, kernel.inertia(DX));
                if (stressed) {
                    double[] vol = fx.store.volume();
                    for (int p = 0; p < N; p++) {
                        particle[4] -= h * vol[p] * (tau[9 * p + 7] - tau[9 * p + 5]);
                        particle[5] -= h * vol[p] * (tau[9 * p + 2] - tau[9 * p + 6]);
                        particle[6] -= h * vol[p] * (tau[9 * p + 3] - tau[9 * p + 1]);
                    }
                }
                FieldSet fields = scatter(fx, h, stressed ? tau : null);
                double[] grid = gridTotals(fx, fields);
                String what = stressed ? " with stress" : "";
                assertEquals(particle[0], grid[0], EXACT * particle[0], "mass" + what);
                assertClose(particle, grid, 1, "momentum" + what);
                assertClose(particle, grid, 4, "angular momentum" + what);
            }
        }
    }

    /**
     * P2G then G2P of an affine velocity field v = v0 + A x, carried by particles with C = A, gives back v_p and
     * C_p = A on every particle: APIC transfers affine fields without loss (Jiang et al. 2015). The rigid case
     * A = skew(w), v = v0 + w x x, comes out as C = skew(w).
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void roundTripKeepsAffineAndRigidFields(Kernel kernel) {
        double[] w = {1.5, -2.0, 0.7};
        double[] skew = {0, -w[2], w[1], w[2], 0, -w[0], -w[1], w[0], 0};
        double[] general = new double[9];
        for (int k = 0; k < 9; k++) {
            general[k] = 4 * (2 * rand.nextDouble() - 1);
        }
        for (double[] a : new double[][] {skew, general}) {
            try (GridFixture fx = randomCloud(kernel, 2)) {
                double[] v0 = {0.3, -0.2, 0.5};
                double[] x = fx.store.position();
                double[] v = fx.store.velocity();
                double[] c = fx.store.affine();
                for (int p = 0; p < N; p++) {
                    affine(v0, a, x, p, v);
                    System.arraycopy(a, 0, c, 9 * p, 9);
                }
                FieldSet fields = scatter(fx, 0, null);
                double[] gm = fields.mass(0);
                double[] gv = fields.momentum(0);
                for (int i = 0; i < fx.grid.nodeCount(); i++) {
                    for (int k = 0; k < 3; k++) {
                        gv[3 * i + k] = gm[i] > 0 ? gv[3 * i + k] / gm[i] : 0;
                    }
                }
                java.util.Arrays.fill(v, 0.0);
                java.util.Arrays.fill(c, 0.0);
                GridToParticle g2p = new GridToParticle(fx.store, fx.layout, fields, fx.stencils, 2, kernel,
                        fx.origin, DX, new ParticleObstacleContact(List.of(), fx.origin, DX),
                        new WallHold(new dev.fray.core.boundary.Bounds(0, 0, 0, 1, 1, 1),
                                java.util.Collections.nCopies(6, Contact.open()), DX));
                g2p.prepare();
                fx.workers.forEach(fx.layout.blockCount(), (wk, r) -> g2p.gatherBlock(wk, r, 0, FieldRouting.SINGLE));
                double[] expect = new double[3 * N];
                double aNorm = 0;
                for (int k = 0; k < 9; k++) {
                    aNorm = Math.max(aNorm, Math.abs(a[k]));
                }
                for (int p = 0; p < N; p++) {
                    affine(v0, a, x, p, expect);
                    for (int k = 0; k < 3; k++) {
                        assertEquals(expect[3 * p + k], v[3 * p + k], EXACT, "v of particle " + p);
                    }
                    for (int k = 0; k < 9; k++) {
                        assertEquals(a[k], c[9 * p + k], EXACT * aNorm, "C of particle " + p);
                    }
                }
            }
        }
    }

    /**
     * A spinning, translating elastic body with no gravity and open walls keeps its linear and angular momentum
     * (the latter with the APIC spin) to 1e-9 relative over 200 explicit steps. Published: Jiang et al. 2015
     * (APIC conserves both; with the symmetric Kirchhoff stress the MLS force term does too); VALIDATION.md B11.
     */
    @Test
    void spinningBodyKeepsItsMomentaOverARun() {
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1).cellSize(0.04).gravity(0, 0, 0).walls(Contact.open())
                .add(Body.named("spinner").shape(Shapes.box(0.4, 0.42, 0.44, 0.6, 0.58, 0.56))
                        .material(new SimpleNeoHookean(1e5, 0.3, 1000)).jitter(0.2).seed(11)
                        .velocity(0.3, -0.2, 0.1).angularVelocity(1.0, 2.0, -1.5).build())
                .build();
        try (Simulation sim = new Simulation(scene, new RunOptions(2))) {
            Diagnostics d0 = sim.diagnostics();
            for (int i = 0; i < 200; i++) {
                sim.step();
            }
            Diagnostics d1 = sim.diagnostics();
            double[] before = {d0.momentumX(), d0.momentumY(), d0.momentumZ(), d0.angularX(), d0.angularY(),
                d0.angularZ()};
            double[] after = {d1.momentumX(), d1.momentumY(), d1.momentumZ(), d1.angularX(), d1.angularY(),
                d1.angularZ()};
            assertTrue(d1.elasticEnergy() > 0, "the spin strains the body, so the stress term is exercised");
            for (int k = 0; k < 6; k += 3) {
                double scale = Math.sqrt(before[k] * before[k] + before[k + 1] * before[k + 1]
                        + before[k + 2] * before[k + 2]);
                for (int j = k; j < k + 3; j++) {
                    assertEquals(before[j], after[j], 1e-9 * scale, (k == 0 ? "momentum " : "angular momentum ") + j);
                }
            }
        }
    }

    /** Random particles with a common drift and spin plus noise, and random affine matrices. */
    private GridFixture randomCloud(Kernel kernel, int threads) {
        GridFixture fx = new GridFixture(GridFixture.randomParticles(rand, N, 0.3, 0.7), kernel, ORIGIN, DX, threads);
        double[] x = fx.store.position();
        double[] v = fx.store.velocity();
        double[] c = fx.store.affine();
        for (int p = 0; p < N; p++) {
            double rx = x[3 * p] - 0.5, ry = x[3 * p + 1] - 0.5, rz = x[3 * p + 2] - 0.5;
            v[3 * p] = 0.4 + 2 * ry - rz + 0.1 * rand.nextGaussian();
            v[3 * p + 1] = -0.3 - 2 * rx + 0.5 * rz + 0.1 * rand.nextGaussian();
            v[3 * p + 2] = 0.2 + rx - 0.5 * ry + 0.1 * rand.nextGaussian();
            for (int k = 0; k < 9; k++) {
                c[9 * p + k] = 3 * rand.nextGaussian();
            }
        }
        return fx;
    }

    private static void affine(double[] v0, double[] a, double[] x, int p, double[] out) {
        for (int r = 0; r < 3; r++) {
            out[3 * p + r] = v0[r] + a[3 * r] * x[3 * p] + a[3 * r + 1] * x[3 * p + 1] + a[3 * r + 2] * x[3 * p + 2];
        }
    }

    /** Scatters the fixture's particles into a fresh single field; tau per particle in storage order, or null. */
    private static FieldSet scatter(GridFixture fx, double h, double[] tau) {
        FieldSet fields = new FieldSet(fx.grid, 1);
        fields.zero(0, fx.grid.blockCount());
        Workspace[] ws = {new Workspace(), new Workspace()};
        ParticleToGrid p2g = new ParticleToGrid(fx.store, fx.layout, fields, fx.stencils, ws, fx.workers, fx.kernel,
                fx.dx);
        ParticleToGrid.StressSource source = tau == null ? null
                : (wk, body, from, to, step, out) -> System.arraycopy(tau, 9 * from, out, 0, 9 * (to - from));
        p2g.scatter(h, source, FieldRouting.SINGLE, new int[0], null);
        return fields;
    }

    /** @return mass, momentum (3), angular momentum about the origin with the affine spin (3) of the particles */
    private static double[] particleTotals(GridFixture fx, double inertia) {
        double[] t = new double[7];
        double[] x = fx.store.position();
        double[] v = fx.store.velocity();
        double[] c = fx.store.affine();
        double[] m = fx.store.mass();
        for (int p = 0; p < N; p++) {
            double[] xp = {x[3 * p], x[3 * p + 1], x[3 * p + 2]};
            double[] mv = {m[p] * v[3 * p], m[p] * v[3 * p + 1], m[p] * v[3 * p + 2]};
            // Spin m D eps:C^T: component x is m D (C_zy - C_yz), and cyclically.
            double[] spin = {m[p] * inertia * (c[9 * p + 7] - c[9 * p + 5]),
                m[p] * inertia * (c[9 * p + 2] - c[9 * p + 6]), m[p] * inertia * (c[9 * p + 3] - c[9 * p + 1])};
            add(t, m[p], xp, mv, spin);
        }
        return t;
    }

    /** @return mass, momentum (3) and angular momentum about the origin (3) of the grid nodes */
    private static double[] gridTotals(GridFixture fx, FieldSet fields) {
        double[] t = new double[7];
        double[] gm = fields.mass(0);
        double[] gp = fields.momentum(0);
        double[] xi = new double[3];
        for (int i = 0; i < fx.grid.nodeCount(); i++) {
            fx.nodePosition(i, xi);
            add(t, gm[i], xi, new double[] {gp[3 * i], gp[3 * i + 1], gp[3 * i + 2]}, new double[3]);
        }
        return t;
    }

    private static void add(double[] t, double m, double[] x, double[] mv, double[] spin) {
        t[0] += m;
        for (int k = 0; k < 3; k++) {
            t[1 + k] += mv[k];
        }
        t[4] += x[1] * mv[2] - x[2] * mv[1] + spin[0];
        t[5] += x[2] * mv[0] - x[0] * mv[2] + spin[1];
        t[6] += x[0] * mv[1] - x[1] * mv[0] + spin[2];
    }

    private static void assertClose(double[] expected, double[] actual, int off, String what) {
        double scale = Math.sqrt(expected[off] * expected[off] + expected[off + 1] * expected[off + 1]
                + expected[off + 2] * expected[off + 2]);
        for (int k = off; k < off + 3; k++) {
            assertEquals(expected[k], actual[k], EXACT * scale, what + " component " + (k - off));
        }
    }
}
