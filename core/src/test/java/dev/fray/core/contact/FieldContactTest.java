package dev.fray.core.contact;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

/**
 * Contact between two velocity fields at one node (Bardenhagen, Brackbill and Sulsky, CMAME 187, 2000): the node's
 * momentum is kept, approaching fields lose their relative normal velocity, Coulomb friction lowers the relative
 * tangential velocity by mu times the relative normal velocity removed (never past zero), separating fields are left
 * alone, and the kinetic energy removed is reported.
 */
class FieldContactTest extends FrayTestBase {
    private static final int NODE = 37;
    private static final double TOL = 1e-12;

    /** Without friction: momentum kept, relative normal velocity removed, relative tangential velocity kept. */
    @Test
    void approachingFieldsLoseTheirRelativeNormalVelocity() {
        for (int c = 0; c < 20; c++) {
            Case k = randomApproach();
            double loss = k.apply(0);
            k.checkMomentum();
            double[] rel = k.relativeNow();
            assertEquals(0.0, dot(rel, k.n), TOL * norm(k.rel0), "relative normal velocity after contact");
            double[] tangential0 = k.tangential(k.rel0);
            assertArrayEquals(tangential0, rel, TOL * norm(k.rel0), "relative tangential velocity kept");
            assertEquals(k.kinetic0 - k.kinetic(), loss, TOL * k.kinetic0, "energy removed");
            assertTrue(loss > 0, "an inelastic normal impact removes energy");
        }
    }

    /** With friction the relative slip shrinks by mu |relative normal velocity|, or stops where that is larger. */
    @Test
    void frictionReducesTheRelativeSlipNeverPastZero() {
        for (double mu : new double[] {0.2, 50}) {
            Case k = randomApproach();
            k.apply(mu);
            k.checkMomentum();
            double slip0 = norm(k.tangential(k.rel0));
            double expected = Math.max(0, slip0 - mu * dot(k.rel0, k.n));
            assertEquals(expected, norm(k.relativeNow()), TOL * norm(k.rel0), "slip with mu = " + mu);
            assertTrue(mu < 1 ? expected > 0 : expected == 0, "the case slides for small mu and sticks for large");
        }
    }

    /** Separating fields, a node with one field and a node without a normal are left exactly as they were. */
    @Test
    void separatingOrSingleFieldsAreUntouched() {
        Case k = randomApproach();
        for (int i = 0; i < 3; i++) {
            double t = k.va[3 * NODE + i];
            k.va[3 * NODE + i] = k.vb[3 * NODE + i];
            k.vb[3 * NODE + i] = t;
        }
        assertUnchanged(k, "separating");
        k = randomApproach();
        k.fields.mass(1)[NODE] = 0;
        assertUnchanged(k, "one field");
        k = randomApproach();
        k.len2[NODE] = 0;
        assertUnchanged(k, "no normal");
    }

    private static void assertUnchanged(Case k, String what) {
        double[] a = k.va.clone();
        double[] b = k.vb.clone();
        assertEquals(0.0, k.apply(0.3), what + ": no energy removed");
        assertArrayEquals(a, k.va, 0.0, what);
        assertArrayEquals(b, k.vb, 0.0, what);
    }

    /** Two fields at one node of a one-block grid, approaching along a random normal of random length. */
    private Case randomApproach() {
        SparseGrid grid = new SparseGrid();
        grid.activate(SparseGrid.key(2, -1, 0));
        grid.allocateNodes();
        Case k = new Case(new FieldSet(grid, 2));
        double[] n = {rand.nextGaussian(), rand.nextGaussian(), rand.nextGaussian()};
        double len = norm(n);
        double scale = 0.1 + 10 * rand.nextDouble();
        for (int i = 0; i < 3; i++) {
            k.n[i] = n[i] / len;
            k.normals[3 * NODE + i] = scale * k.n[i];
        }
        k.len2[NODE] = scale * scale * dot(k.n, k.n);
        k.fields.mass(0)[NODE] = 0.5 + rand.nextDouble();
        k.fields.mass(1)[NODE] = 0.1 + 3 * rand.nextDouble();
        for (int i = 0; i < 3; i++) {
            k.va[3 * NODE + i] = rand.nextGaussian();
            k.vb[3 * NODE + i] = rand.nextGaussian();
        }
        double approach = dot(k.relativeNow(), k.n);
        if (approach <= 0) {
            for (int i = 0; i < 3; i++) {
                k.va[3 * NODE + i] -= 2 * approach * k.n[i] - 0.1 * k.n[i];
            }
        }
        k.snapshot();
        return k;
    }

    /** One node's two fields with the values before contact. */
    private static final class Case {
        final FieldSet fields;
        final double[] va;
        final double[] vb;
        final double[] normals = new double[3 * SparseGrid.NODES_PER_BLOCK];
        final double[] len2 = new double[SparseGrid.NODES_PER_BLOCK];
        final double[] n = new double[3];
        double[] momentum0;
        double[] rel0;
        double kinetic0;

        Case(FieldSet fields) {
            this.fields = fields;
            fields.ensureNodes();
            this.va = fields.momentum(0);
            this.vb = fields.momentum(1);
        }

        void snapshot() {
            momentum0 = momentum();
            rel0 = relativeNow();
            kinetic0 = kinetic();
        }

        double apply(double mu) {
            return new FieldContact(mu).apply(fields, normals, len2, 0, 1);
        }

        double[] momentum() {
            double ma = fields.mass(0)[NODE];
            double mb = fields.mass(1)[NODE];
            double[] p = new double[3];
            for (int i = 0; i < 3; i++) {
                p[i] = ma * va[3 * NODE + i] + mb * vb[3 * NODE + i];
            }
            return p;
        }

        void checkMomentum() {
            assertArrayEquals(momentum0, momentum(), TOL * norm(momentum0) + 1e-15, "node momentum kept");
        }

        double kinetic() {
            double ma = fields.mass(0)[NODE];
            double mb = fields.mass(1)[NODE];
            double s = 0;
            for (int i = 0; i < 3; i++) {
                s += 0.5 * (ma * va[3 * NODE + i] * va[3 * NODE + i] + mb * vb[3 * NODE + i] * vb[3 * NODE + i]);
            }
            return s;
        }

        double[] relativeNow() {
            return new double[] {va[3 * NODE] - vb[3 * NODE], va[3 * NODE + 1] - vb[3 * NODE + 1],
                va[3 * NODE + 2] - vb[3 * NODE + 2]};
        }

        double[] tangential(double[] r) {
            double rn = dot(r, n);
            return new double[] {r[0] - rn * n[0], r[1] - rn * n[1], r[2] - rn * n[2]};
        }
    }

    private static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }

    private static double norm(double[] a) {
        return Math.sqrt(dot(a, a));
    }
}
