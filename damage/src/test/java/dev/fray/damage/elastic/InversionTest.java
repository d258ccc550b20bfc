package dev.fray.damage.elastic;

import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Crushing a particle through zero volume: energy and stress stay finite, the energy keeps growing, and the stress
 * keeps pushing back. Published: Irving, Teran and Fedkiw 2004, Invertible finite elements for robust simulation
 * of large deformation (the behaviour asked for); the floors are Fray's own choice (common practice, no source).
 */
class InversionTest extends FrayTestBase {
    /** P across the floor of the logarithm: the continuation is C1, so P changes by O(step) only. */
    private static final double FLOOR_CONTINUITY = 1e-6;

    static List<String> laws() {
        return Elastic.names();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("laws")
    void uniaxialCrushThroughZeroKeepsCostingEnergy(String name) {
        MaterialLaw law = Elastic.byName(name, 1e6, 0.3, 1000.0);
        // F = diag(1, 1, s), s from 0.5 down through the floors (1e-6) and zero to -0.5
        double[] s = {0.5, 0.1, 1e-2, 1e-4, 1e-5, 2e-6, 1.000001e-6, 1e-6, 0.999999e-6, 5e-7, 1e-7, 0.0, -1e-7,
                -1e-6, -1e-3, -0.1, -0.5};
        double[] f = new double[9 * s.length];
        for (int i = 0; i < s.length; i++) {
            f[9 * i] = 1;
            f[9 * i + 4] = 1;
            f[9 * i + 8] = s[i];
        }
        ArrayMaterialState state = new ArrayMaterialState(f);
        double[] psi = new double[s.length];
        double[] p = new double[9 * s.length];
        law.energyDensity(state, 0, s.length, psi);
        law.firstPiolaKirchhoff(state, 0, s.length, p);
        for (int i = 0; i < s.length; i++) {
            assertTrue(Double.isFinite(psi[i]), "psi at s = " + s[i]);
            assertTrue(Double.isFinite(p[9 * i + 8]), "P_22 at s = " + s[i]);
            assertTrue(p[9 * i + 8] < 0, "P_22 = " + p[9 * i + 8] + " at s = " + s[i] + " does not push back");
            if (i > 0) {
                assertTrue(psi[i] > psi[i - 1], "psi does not grow from s = " + s[i - 1] + " to s = " + s[i]);
            }
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("laws")
    void stressIsContinuousAcrossTheFloor(String name) {
        MaterialLaw law = Elastic.byName(name, 1e6, 0.3, 1000.0);
        // diag(1, 1, s) has J = s and smallest stretch s, so both floors sit at s = 1e-6
        assertEquals(NeoHookean.J_FLOOR, HenckyStVK.STRETCH_FLOOR, 0.0);
        double floor = NeoHookean.J_FLOOR;
        double[] f = {1, 0, 0, 0, 1, 0, 0, 0, floor * (1 + 1e-9), 1, 0, 0, 0, 1, 0, 0, 0, floor * (1 - 1e-9)};
        double[] p = new double[18];
        law.firstPiolaKirchhoff(new ArrayMaterialState(f), 0, 2, p);
        double above = p[8];
        double below = p[17];
        assertEquals(above, below, FLOOR_CONTINUITY * Math.abs(above), "P_22 just above and below the floor");
    }
}
