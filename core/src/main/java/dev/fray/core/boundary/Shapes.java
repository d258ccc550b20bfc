package dev.fray.core.boundary;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

/** Factories for the analytic shapes: half-space, box, sphere and capped cylinder. All lengths in m. */
public final class Shapes {
    private Shapes() {
    }

    /**
     * The half-space {x : n . (x - p) &lt;= 0}: solid below a plane through p with outward normal n.
     *
     * @param px point on the plane
     * @param py point on the plane
     * @param pz point on the plane
     * @param nx outward normal (normalised here)
     * @param ny outward normal
     * @param nz outward normal
     * @return the shape
     */
    public static Shape halfSpace(double px, double py, double pz, double nx, double ny, double nz) {
        return new HalfSpace(px, py, pz, nx, ny, nz);
    }

    /**
     * Axis-aligned box.
     *
     * @param minX smallest x
     * @param minY smallest y
     * @param minZ smallest z
     * @param maxX largest x
     * @param maxY largest y
     * @param maxZ largest z
     * @return the shape
     */
    public static Shape box(double minX, double minY, double minZ, double maxX, double maxY, double maxZ) {
        return new Box(minX, minY, minZ, maxX, maxY, maxZ);
    }

    /**
     * @param cx     centre
     * @param cy     centre
     * @param cz     centre
     * @param radius radius, &gt; 0
     * @return the ball
     */
    public static Shape sphere(double cx, double cy, double cz, double radius) {
        return new Sphere(cx, cy, cz, radius);
    }

    /**
     * Capped cylinder.
     *
     * @param cx         centre of the axis segment
     * @param cy         centre
     * @param cz         centre
     * @param ax         axis direction (normalised here)
     * @param ay         axis direction
     * @param az         axis direction
     * @param radius     radius, &gt; 0
     * @param halfLength half the length along the axis, &gt; 0
     * @return the shape
     */
    public static Shape cylinder(double cx, double cy, double cz, double ax, double ay, double az, double radius,
                                 double halfLength) {
        return new Cylinder(cx, cy, cz, ax, ay, az, radius, halfLength);
    }

    static double[] unit(String field, double x, double y, double z) {
        Checks.finite(field + " x", x);
        Checks.finite(field + " y", y);
        Checks.finite(field + " z", z);
        double n = Math.sqrt(x * x + y * y + z * z);
        if (!(n > 0)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, "(0, 0, 0)", "a non-zero vector");
        }
        return new double[] {x / n, y / n, z / n};
    }

    /** Plane half-space. */
    public record HalfSpace(double px, double py, double pz, double nx, double ny, double nz) implements Shape {
        /** Normalises the normal. */
        public HalfSpace {
            Checks.finite("half-space point x (m)", px);
            Checks.finite("half-space point y (m)", py);
            Checks.finite("half-space point z (m)", pz);
            double[] n = unit("half-space normal", nx, ny, nz);
            nx = n[0];
            ny = n[1];
            nz = n[2];
        }

        @Override
        public double distance(double x, double y, double z) {
            return nx * (x - px) + ny * (y - py) + nz * (z - pz);
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            out[off] = nx;
            out[off + 1] = ny;
            out[off + 2] = nz;
        }

        @Override
        public Bounds bounds() {
            return Bounds.EVERYWHERE;
        }
    }

    /** Axis-aligned box. */
    public record Box(double minX, double minY, double minZ, double maxX, double maxY, double maxZ)
            implements Shape {
        /** Checks the corners. */
        public Box {
            Checks.finite("box minX (m)", minX);
            Checks.finite("box minY (m)", minY);
            Checks.finite("box minZ (m)", minZ);
            Checks.finite("box maxX (m)", maxX);
            Checks.finite("box maxY (m)", maxY);
            Checks.finite("box maxZ (m)", maxZ);
            if (!(maxX > minX && maxY > minY && maxZ > minZ)) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "box",
                        "each max must exceed its min, got " + new Bounds(minX, minY, minZ, maxX, maxY, maxZ));
            }
        }

        @Override
        public double distance(double x, double y, double z) {
            double qx = Math.abs(x - 0.5 * (minX + maxX)) - 0.5 * (maxX - minX);
            double qy = Math.abs(y - 0.5 * (minY + maxY)) - 0.5 * (maxY - minY);
            double qz = Math.abs(z - 0.5 * (minZ + maxZ)) - 0.5 * (maxZ - minZ);
            double ox = Math.max(qx, 0), oy = Math.max(qy, 0), oz = Math.max(qz, 0);
            double outside = Math.sqrt(ox * ox + oy * oy + oz * oz);
            return outside + Math.min(Math.max(qx, Math.max(qy, qz)), 0.0);
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            double dx = x - 0.5 * (minX + maxX), dy = y - 0.5 * (minY + maxY), dz = z - 0.5 * (minZ + maxZ);
            double qx = Math.abs(dx) - 0.5 * (maxX - minX);
            double qy = Math.abs(dy) - 0.5 * (maxY - minY);
            double qz = Math.abs(dz) - 0.5 * (maxZ - minZ);
            double sx = Math.signum(dx) == 0 ? 1 : Math.signum(dx);
            double sy = Math.signum(dy) == 0 ? 1 : Math.signum(dy);
            double sz = Math.signum(dz) == 0 ? 1 : Math.signum(dz);
            if (qx > 0 || qy > 0 || qz > 0) {
                double ox = Math.max(qx, 0) * sx, oy = Math.max(qy, 0) * sy, oz = Math.max(qz, 0) * sz;
                double n = Math.sqrt(ox * ox + oy * oy + oz * oz);
                out[off] = ox / n;
                out[off + 1] = oy / n;
                out[off + 2] = oz / n;
            } else {
                // Inside: the face nearest to the point.
                out[off] = 0;
                out[off + 1] = 0;
                out[off + 2] = 0;
                if (qx >= qy && qx >= qz) {
                    out[off] = sx;
                } else if (qy >= qz) {
                    out[off + 1] = sy;
                } else {
                    out[off + 2] = sz;
                }
            }
        }

        @Override
        public Bounds bounds() {
            return new Bounds(minX, minY, minZ, maxX, maxY, maxZ);
        }
    }

    /** Ball. */
    public record Sphere(double cx, double cy, double cz, double radius) implements Shape {
        /** Checks the values. */
        public Sphere {
            Checks.finite("sphere centre x (m)", cx);
            Checks.finite("sphere centre y (m)", cy);
            Checks.finite("sphere centre z (m)", cz);
            Checks.positive("sphere radius (m)", radius);
        }

        @Override
        public double distance(double x, double y, double z) {
            double dx = x - cx, dy = y - cy, dz = z - cz;
            return Math.sqrt(dx * dx + dy * dy + dz * dz) - radius;
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            double dx = x - cx, dy = y - cy, dz = z - cz;
            double n = Math.sqrt(dx * dx + dy * dy + dz * dz);
            if (n == 0) {
                out[off] = 0;
                out[off + 1] = 1;
                out[off + 2] = 0;
                return;
            }
            out[off] = dx / n;
            out[off + 1] = dy / n;
            out[off + 2] = dz / n;
        }

        @Override
        public Bounds bounds() {
            return new Bounds(cx - radius, cy - radius, cz - radius, cx + radius, cy + radius, cz + radius);
        }
    }

    /** Capped cylinder. */
    public record Cylinder(double cx, double cy, double cz, double ax, double ay, double az, double radius,
                           double halfLength) implements Shape {
        /** Normalises the axis and checks the values. */
        public Cylinder {
            Checks.finite("cylinder centre x (m)", cx);
            Checks.finite("cylinder centre y (m)", cy);
            Checks.finite("cylinder centre z (m)", cz);
            double[] a = unit("cylinder axis", ax, ay, az);
            ax = a[0];
            ay = a[1];
            az = a[2];
            Checks.positive("cylinder radius (m)", radius);
            Checks.positive("cylinder halfLength (m)", halfLength);
        }

        @Override
        public double distance(double x, double y, double z) {
            double dx = x - cx, dy = y - cy, dz = z - cz;
            double h = dx * ax + dy * ay + dz * az;
            double rx = dx - h * ax, ry = dy - h * ay, rz = dz - h * az;
            double qr = Math.sqrt(rx * rx + ry * ry + rz * rz) - radius;
            double qh = Math.abs(h) - halfLength;
            double or = Math.max(qr, 0), oh = Math.max(qh, 0);
            return Math.sqrt(or * or + oh * oh) + Math.min(Math.max(qr, qh), 0.0);
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            double dx = x - cx, dy = y - cy, dz = z - cz;
            double h = dx * ax + dy * ay + dz * az;
            double rx = dx - h * ax, ry = dy - h * ay, rz = dz - h * az;
            double r = Math.sqrt(rx * rx + ry * ry + rz * rz);
            double ux, uy, uz;
            if (r > 0) {
                ux = rx / r;
                uy = ry / r;
                uz = rz / r;
            } else {
                // On the axis any radial direction will do; pick one perpendicular to the axis.
                double px = Math.abs(ax) < 0.9 ? 1 : 0, py = px == 1 ? 0 : 1;
                double t = px * ax + py * ay;
                ux = px - t * ax;
                uy = py - t * ay;
                uz = -t * az;
                double n = Math.sqrt(ux * ux + uy * uy + uz * uz);
                ux /= n;
                uy /= n;
                uz /= n;
            }
            double sh = h >= 0 ? 1 : -1;
            double qr = r - radius;
            double qh = Math.abs(h) - halfLength;
            double gr, gh;
            if (qr > 0 || qh > 0) {
                gr = Math.max(qr, 0);
                gh = Math.max(qh, 0);
                double n = Math.sqrt(gr * gr + gh * gh);
                gr /= n;
                gh /= n;
            } else if (qr >= qh) {
                gr = 1;
                gh = 0;
            } else {
                gr = 0;
                gh = 1;
            }
            out[off] = gr * ux + gh * sh * ax;
            out[off + 1] = gr * uy + gh * sh * ay;
            out[off + 2] = gr * uz + gh * sh * az;
        }

        @Override
        public Bounds bounds() {
            // Loose box: the segment's end caps padded by the radius.
            double ex = Math.abs(ax) * halfLength + radius;
            double ey = Math.abs(ay) * halfLength + radius;
            double ez = Math.abs(az) * halfLength + radius;
            return new Bounds(cx - ex, cy - ey, cz - ez, cx + ex, cy + ey, cz + ez);
        }
    }
}
