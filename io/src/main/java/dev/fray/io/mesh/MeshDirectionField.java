package dev.fray.io.mesh;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelField;

/**
 * A direction field taken from a per-vertex attribute of width 3 of a mesh (for example the {@code fx fy fz}
 * properties of a PLY file, attribute "f"), for filling a width-3 channel such as a fiber direction:
 * {@code Body.Builder.initialChannel(FiberChannels.reference(1), MeshDirectionField.of(shape, "f"))}.
 *
 * <p>At a point, the nearest triangle of the mesh is found and its three vertex directions are blended with the
 * barycentric weights of the nearest surface point, then normalised. Directions are treated as axes (a fiber
 * along d is the same as one along -d): before blending, each vertex direction is flipped if needed to agree with
 * the one of largest weight, so opposite signs at neighbouring vertices do not cancel. Where the blend has no
 * length (every vertex direction zero there), the field gives the zero vector, which fiber channels read as "no
 * fiber". Dimensionless.
 *
 * <p>Immutable and thread-safe.
 */
public final class MeshDirectionField implements ChannelField {
    private final MeshShape shape;
    private final double[] dir;
    private final int[] tri;

    private MeshDirectionField(MeshShape shape, String attribute) {
        Checks.notNull("mesh direction attribute name", attribute);
        TriangleMesh mesh = shape.mesh();
        int w = mesh.attributeWidth(attribute);
        if (w != 3) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "width of direction attribute \"" + attribute
                    + "\" of mesh \"" + mesh.name() + "\"", w, "3");
        }
        this.shape = shape;
        this.dir = mesh.attributeArray(attribute);
        this.tri = mesh.triangleArray();
    }

    /**
     * @param shape     the shape a body is sampled from (its nearest-triangle search is reused)
     * @param attribute name of a width-3 vertex attribute of the shape's mesh
     * @return the field
     * @throws InvalidInputException MISSING for null arguments, UNKNOWN_NAME for a missing attribute,
     *         OUT_OF_RANGE for an attribute of width 1
     */
    public static MeshDirectionField of(MeshShape shape, String attribute) {
        return new MeshDirectionField(Checks.notNull("mesh shape", shape), attribute);
    }

    /**
     * @param mesh      any mesh, closed or not
     * @param attribute name of a width-3 vertex attribute
     * @return the field (it builds its own search structure)
     * @throws InvalidInputException MISSING for null arguments, UNKNOWN_NAME for a missing attribute,
     *         OUT_OF_RANGE for an attribute of width 1 or a mesh without a triangle of three distinct corners
     */
    public static MeshDirectionField of(TriangleMesh mesh, String attribute) {
        Checks.notNull("mesh", mesh);
        mesh.attributeWidth(Checks.notNull("mesh direction attribute name", attribute)); // fail before building
        return new MeshDirectionField(MeshShape.builder(mesh).allowOpen(true).build(), attribute);
    }

    /**
     * {@inheritDoc}
     *
     * @throws InvalidInputException INCONSISTENT if out has fewer than 3 components (a channel of width 1 or 2)
     */
    @Override
    public void value(double x, double y, double z, double[] out) {
        if (out.length < 3) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "mesh direction field",
                    "fills channels of width 3, got one of width " + out.length);
        }
        double[] s = new double[6];
        int t = shape.nearestTriangle(x, y, z, s);
        if (t < 0) {
            out[0] = out[1] = out[2] = 0;
            return;
        }
        int ref = s[3] >= s[4] && s[3] >= s[5] ? 0 : s[4] >= s[5] ? 1 : 2;
        int r = 3 * tri[3 * t + ref];
        double sx = 0, sy = 0, sz = 0;
        for (int c = 0; c < 3; c++) {
            int v = 3 * tri[3 * t + c];
            double dx = dir[v], dy = dir[v + 1], dz = dir[v + 2];
            double wgt = s[3 + c];
            if (dx * dir[r] + dy * dir[r + 1] + dz * dir[r + 2] < 0) {
                wgt = -wgt;
            }
            sx += wgt * dx;
            sy += wgt * dy;
            sz += wgt * dz;
        }
        double len = Math.sqrt(sx * sx + sy * sy + sz * sz);
        if (len > 0) {
            out[0] = sx / len;
            out[1] = sy / len;
            out[2] = sz / len;
        } else {
            out[0] = out[1] = out[2] = 0;
        }
    }
}
