package dev.fray.damage.plastic;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Plastic;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * A return mapping reports failure instead of writing NaN (DESIGN.md section 4), and the solver turns a reported
 * failure into a divergence that names the particle, in the step it happened, whatever the thread count. Common
 * practice, no source.
 */
class ReturnMappingFailureTest extends FrayTestBase {
    private static final List<MaterialLaw> LAWS = List.of(Plastic.vonMises(1e6, 0.3, 1000, 1e4, 1e5),
            Plastic.druckerPrager(1e6, 0.3, 1600, 30, 0), Plastic.camClay(1e6, 0.3, 1000, 30, 1e4, 0.2, 2));

    @Test
    void nonFiniteDeformationIsReportedAndNothingIsWritten() {
        for (MaterialLaw law : LAWS) {
            int n = 5;
            double[] f = new double[9 * n];
            for (int p = 0; p < n; p++) {
                // large shear that every law must project
                System.arraycopy(PlasticProbe.deformation(rand, 0.2, -0.05, -0.15), 0, f, 9 * p, 9);
            }
            f[9 * 2 + 4] = Double.NaN;
            f[9 * 4] = Double.POSITIVE_INFINITY;
            double[] before = f.clone();
            ArrayMaterialState state = new ArrayMaterialState(f);
            for (ChannelSpec spec : law.channels()) {
                state.withChannel(spec.name(), new double[n * spec.width()]);
            }
            assertEquals(2, law.projectDeformation(state, 1, n), law.name() + ": first failed particle");
            assertArrayEquals(Arrays.copyOfRange(before, 18, 27), Arrays.copyOfRange(f, 18, 27), 0.0,
                    law.name() + ": failed particle's F kept");
            assertFalse(Arrays.equals(Arrays.copyOfRange(before, 27, 36), Arrays.copyOfRange(f, 27, 36)),
                    law.name() + ": the batch went on past the failure");
            assertArrayEquals(Arrays.copyOfRange(before, 0, 9), Arrays.copyOfRange(f, 0, 9), 0.0,
                    law.name() + ": outside the range");
            for (ChannelSpec spec : law.channels()) {
                double[] c = state.channel(spec.name());
                assertEquals(0.0, c[2], 0.0, law.name() + ": " + spec.name() + " of the failed particle");
                assertEquals(0.0, c[4], 0.0, law.name() + ": " + spec.name() + " of the failed particle");
                assertTrue(Arrays.stream(c).allMatch(Double::isFinite), law.name() + ": " + spec.name());
            }
        }
    }

    /** A von Mises law whose mapping fails for particles flagged in its own channel. */
    private record FailingLaw(MaterialLaw inner) implements MaterialLaw {
        static final String FLAG = "fail-here";

        @Override
        public String name() {
            return "failing";
        }

        @Override
        public double density() {
            return inner.density();
        }

        @Override
        public double waveSpeed() {
            return inner.waveSpeed();
        }

        @Override
        public List<ChannelSpec> channels() {
            List<ChannelSpec> c = new ArrayList<>(inner.channels());
            c.add(ChannelSpec.of(FLAG, 1, "1"));
            return c;
        }

        @Override
        public void energyDensity(MaterialState state, int from, int to, double[] out) {
            inner.energyDensity(state, from, to, out);
        }

        @Override
        public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
            inner.firstPiolaKirchhoff(state, from, to, out);
        }

        @Override
        public boolean projectsDeformation() {
            return true;
        }

        @Override
        public int projectDeformation(MaterialState state, int from, int to) {
            int failed = inner.projectDeformation(state, from, to);
            double[] flag = state.channel(FLAG);
            for (int p = from; p < to && failed < 0; p++) {
                failed = flag[p] == 1 ? p : -1;
            }
            return failed;
        }
    }

    @ParameterizedTest(name = "{0} threads")
    @ValueSource(ints = {1, 2})
    void solverStopsNamingTheFailedParticle(int threads) {
        Scene scene = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 16).threads(threads)
                .add(Body.named("putty").shape(Shapes.box(0.2, 0.2, 0.2, 0.8, 0.5, 0.8))
                        .material(new FailingLaw(Plastic.vonMises(1e5, 0.3, 1000, 1e3, 0)))
                        .initialChannel(FailingLaw.FLAG, (x, y, z, out) -> out[0] = x > 0.7 && z > 0.7 ? 1 : 0)
                        .build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            double[] flag = new double[sim.particles().size()];
            sim.particles().copyById(FailingLaw.FLAG, flag, 0);
            SimulationDivergedException e = assertThrows(SimulationDivergedException.class, sim::step);
            assertEquals(FrayMessage.DIVERGED, e.key());
            assertEquals("putty", e.body());
            assertEquals(1.0, flag[e.particleId()], "the named particle is one whose mapping failed");
            assertEquals(0, e.step());
            assertTrue(e.getMessage().contains("return mapping"), e.getMessage());
        }
    }
}
