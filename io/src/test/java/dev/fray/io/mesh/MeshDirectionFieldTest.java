package dev.fray.io.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.io.mesh.MeshFixtures.Encoding;
import dev.fray.io.mesh.MeshFixtures.Raw;

import java.io.ByteArrayInputStream;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Direction fields from a PLY direction attribute. Checks use the linear precision of barycentric interpolation
 * (published: barycentric coordinates reproduce linear functions exactly on a triangle).
 */
class MeshDirectionFieldTest extends FrayTestBase {
    private static final double TOLERANCE = 1e-6; // the PLY stores float32 directions

    /** The cube as a binary PLY whose vertex v has direction (1, y_v, 0) (unnormalised) in fx fy fz. */
    private static TriangleMesh cubeWithDirections(double[] fx, double[] fy, double[] fz) {
        Raw cube = MeshFixtures.cube();
        byte[] ply = MeshFixtures.ply(cube, Encoding.LITTLE, "float", new String[] {"fx", "fy", "fz"},
                new double[][] {fx, fy, fz});
        return PlyReader.read(new ByteArrayInputStream(ply), "fibers.ply");
    }

    @Test
    void interpolatesLinearDirectionsFromTheNearestTriangle() {
        Raw cube = MeshFixtures.cube();
        double[] fx = new double[8], fy = new double[8], fz = new double[8];
        for (int v = 0; v < 8; v++) {
            fx[v] = 1;
            fy[v] = cube.p()[3 * v + 1];
        }
        TriangleMesh mesh = cubeWithDirections(fx, fy, fz);
        MeshDirectionField field = MeshDirectionField.of(MeshShape.of(mesh), "f");
        double[] out = new double[3];
        for (int i = 0; i < 500; i++) {
            // Just above the bottom face, whose triangles are then the nearest.
            double x = 0.1 + 0.8 * rand.nextDouble(), y = 0.1 + 0.8 * rand.nextDouble(), z = 0.05 * rand.nextDouble();
            field.value(x, y, z, out);
            double n = Math.sqrt(1 + y * y);
            assertEquals(1 / n, out[0], TOLERANCE);
            assertEquals(y / n, out[1], TOLERANCE);
            assertEquals(0, out[2], TOLERANCE);
        }
        // Built from the mesh directly, the same values.
        MeshDirectionField direct = MeshDirectionField.of(mesh, "f");
        double[] a = new double[3];
        direct.value(0.3, 0.6, 0.01, a);
        field.value(0.3, 0.6, 0.01, out);
        assertEquals(out[1], a[1]);
    }

    @Test
    void oppositeSignsAreTheSameAxisAndZeroMeansNoFiber() {
        double[] fx = new double[8], fy = new double[8], fz = new double[8];
        for (int v = 0; v < 8; v++) {
            fz[v] = (v & 1) == 0 ? 1 : -1; // along z, sign alternating with x
        }
        MeshDirectionField field = MeshDirectionField.of(cubeWithDirections(fx, fy, fz), "f");
        double[] out = new double[3];
        for (int i = 0; i < 200; i++) {
            field.value(rand.nextDouble(), rand.nextDouble(), rand.nextDouble(), out);
            assertEquals(1.0, Math.abs(out[2]), 1e-12, "an axis, never cancelled by the sign flips");
        }
        MeshDirectionField none = MeshDirectionField.of(cubeWithDirections(new double[8], new double[8],
                new double[8]), "f");
        none.value(0.5, 0.5, 0.5, out);
        assertEquals(0.0, out[0] * out[0] + out[1] * out[1] + out[2] * out[2]);
    }

    @Test
    void rejectsWrongAttributesAndChannels() {
        TriangleMesh mesh = MeshFixtures.cube().mesh().withAttribute("q", 1, new double[8]);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> MeshDirectionField.of(mesh, "q"));
        assertEquals(FrayMessage.OUT_OF_RANGE, e.key());
        e = assertThrows(InvalidInputException.class, () -> MeshDirectionField.of(mesh, "f"));
        assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
        MeshDirectionField f = MeshDirectionField.of(mesh.withAttribute("f", 3, new double[24]), "f");
        e = assertThrows(InvalidInputException.class, () -> f.value(0, 0, 0, new double[1]));
        assertEquals(FrayMessage.INCONSISTENT, e.key());
    }

    /** An elastic law that also declares the fiber-1 channel, so a body can take a fiber field. */
    private record WithFiberChannel(MaterialLaw base) implements MaterialLaw {
        @Override
        public String name() {
            return base.name();
        }

        @Override
        public double density() {
            return base.density();
        }

        @Override
        public double waveSpeed() {
            return base.waveSpeed();
        }

        @Override
        public List<ChannelSpec> channels() {
            return List.of(FiberChannels.referenceSpec(1));
        }

        @Override
        public void energyDensity(MaterialState state, int from, int to, double[] out) {
            base.energyDensity(state, from, to, out);
        }

        @Override
        public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
            base.firstPiolaKirchhoff(state, from, to, out);
        }
    }

    @Test
    void aBodyTakesItsFiberFieldFromTheMeshItIsSampledFrom() {
        Raw cube = MeshFixtures.cube();
        double[] fx = new double[8], fy = new double[8], fz = new double[8];
        for (int v = 0; v < 8; v++) {
            fx[v] = 1;
            fy[v] = cube.p()[3 * v + 1];
        }
        MeshShape shape = MeshShape.of(cubeWithDirections(fx, fy, fz));
        MeshDirectionField field = MeshDirectionField.of(shape, "f");
        Scene scene = Scene.builder().domain(-0.5, -0.5, -0.5, 1.5, 1.5, 1.5).cellSize(0.1).threads(2)
                .add(Body.named("fibrous").shape(shape)
                        .material(new WithFiberChannel(Elastic.neoHookean(1e5, 0.3, 1000)))
                        .initialChannel(FiberChannels.reference(1), field).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            ParticleView pv = sim.particles();
            assertTrue(pv.size() > 500);
            double[] expected = new double[3];
            for (int p = 0; p < pv.size(); p++) {
                double x = pv.get("position", p, 0), y = pv.get("position", p, 1), z = pv.get("position", p, 2);
                field.value(x, y, z, expected);
                for (int k = 0; k < 3; k++) {
                    assertEquals(expected[k], pv.get(FiberChannels.reference(1), p, k));
                }
                double len = Math.sqrt(expected[0] * expected[0] + expected[1] * expected[1]
                        + expected[2] * expected[2]);
                assertEquals(1.0, len, 1e-12);
            }
        }
    }
}
