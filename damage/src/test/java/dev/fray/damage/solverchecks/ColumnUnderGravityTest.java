package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.elastic.ElasticParameters;
import org.junit.jupiter.api.Test;

/** VALIDATION B13: laterally constrained elastic column settling under its own weight. */
class ColumnUnderGravityTest extends FrayTestBase {
    @Test
    void stressAndSettlementMatchStaticEquilibrium() {
        double height = 1.0;
        double dx = height / 32;
        double e = 1e6, nu = 0.3, rho = 1000, g = 9.81;
        MaterialLaw law = Elastic.neoHookean(e, nu, rho);
        ElasticParameters params = new ElasticParameters(e, nu, rho);
        double modulus = params.lambda() + 2 * params.mu();
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 2 * dx, 1.25 * height, 2 * dx).cellSize(dx).gravity(0, -g, 0)
                .walls(Contact.slip(0)).wall("yMin", Contact.sticky()).wall("yMax", Contact.open())
                .damping(40).threads(2)
                .add(Body.named("column").shape(Shapes.box(0, 0, 0, 2 * dx, height, 2 * dx)).material(law).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            double[] y0 = Probes.byId(sim.particles(), ParticleStore.POSITION);
            sim.run(0.8);
            ParticleView v = sim.particles();
            assertTrue(sim.diagnostics().maxSpeed() < 1e-4, "column at rest, max speed " + sim.diagnostics().maxSpeed());
            double[] y = Probes.byId(v, ParticleStore.POSITION);
            double[] f = Probes.byId(v, ParticleStore.DEFORMATION);
            double[] tau = new double[9 * v.size()];
            law.kirchhoffStress(new ArrayMaterialState(f), 0, v.size(), tau);
            // Published: 1D static equilibrium of an elastic column, sigma_yy(s) = -rho g s at depth s, and
            // settlement u(H) = rho g H^2 / (2 (lambda + 2 mu)); MPM benchmark of Wyser et al., GMD 13 (2020).
            double topSum = 0;
            int topCount = 0;
            double maxRel = 0;
            for (int band = 4; band <= 12; band++) {
                double depth = band / 16.0 * height;
                double sum = 0;
                int count = 0;
                for (int i = 0; i < v.size(); i++) {
                    double d = height - y0[3 * i + 1];
                    if (Math.abs(d - depth) < dx / 2) {
                        double j = det(f, 9 * i);
                        sum += tau[9 * i + 4] / j;
                        count++;
                    }
                }
                double sigma = sum / count;
                double expected = -rho * g * depth;
                maxRel = Math.max(maxRel, Math.abs(sigma - expected) / Math.abs(expected));
                assertEquals(expected, sigma, 0.05 * Math.abs(expected), "sigma_yy at depth " + depth + " m");
            }
            for (int i = 0; i < v.size(); i++) {
                if (y0[3 * i + 1] > height - dx / 2) {
                    topSum += y0[3 * i + 1] - y[3 * i + 1];
                    topCount++;
                }
            }
            double settlement = topSum / topCount;
            double expected = rho * g * height * height / (2 * modulus);
            assertEquals(expected, settlement, 0.05 * expected, "top settlement (stress error " + maxRel + ")");
        }
    }

    private static double det(double[] a, int o) {
        return a[o] * (a[o + 4] * a[o + 8] - a[o + 5] * a[o + 7]) - a[o + 1] * (a[o + 3] * a[o + 8] - a[o + 5] * a[o + 6])
                + a[o + 2] * (a[o + 3] * a[o + 7] - a[o + 4] * a[o + 6]);
    }
}
