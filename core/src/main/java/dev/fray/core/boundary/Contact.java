package dev.fray.core.boundary;

import dev.fray.core.error.Checks;

/**
 * How material meets a boundary, applied to grid node velocities relative to the boundary's own velocity.
 *
 * @param type     the contact law
 * @param friction Coulomb friction coefficient (dimensionless, &gt;= 0), used by {@link Type#SLIP} and
 *                 {@link Type#SEPARATING}
 */
public record Contact(Type type, double friction) implements ContactLaw {
    /** Contact laws. */
    public enum Type {
        /** No boundary at all (an open domain face). */
        OPEN,
        /** Material takes the boundary's velocity. */
        STICKY,
        /**
         * Normal velocity removed in both directions; tangential velocity kept, reduced by Coulomb friction. On a
         * domain wall, material that has reached it stays on it (see {@link WallHold}).
         */
        SLIP,
        /** Normal velocity removed only when moving into the boundary; Coulomb friction on the tangential part. */
        SEPARATING
    }

    /** Checks the coefficient. */
    public Contact {
        Checks.notNull("contact type", type);
        Checks.nonNegative("friction coefficient", friction);
    }

    /** @return an open face: no boundary */
    public static Contact open() {
        return new Contact(Type.OPEN, 0);
    }

    /** @return sticky contact */
    public static Contact sticky() {
        return new Contact(Type.STICKY, 0);
    }

    /**
     * @param friction Coulomb coefficient
     * @return slip contact
     */
    public static Contact slip(double friction) {
        return new Contact(Type.SLIP, friction);
    }

    /**
     * @param friction Coulomb coefficient
     * @return separating contact
     */
    public static Contact separating(double friction) {
        return new Contact(Type.SEPARATING, friction);
    }

    /** {@inheritDoc} */
    @Override
    public boolean acts() {
        return type != Type.OPEN;
    }

    /** {@inheritDoc} */
    @Override
    public boolean fixesAll() {
        return type == Type.STICKY;
    }

    /** {@inheritDoc} */
    @Override
    public boolean holdsNormal() {
        return type == Type.STICKY || type == Type.SLIP;
    }

    /** {@inheritDoc} */
    @Override
    public void apply(double[] v, int off, double[] n, int no, double bx, double by, double bz) {
        switch (type) {
            case OPEN:
                return;
            case STICKY:
                v[off] = bx;
                v[off + 1] = by;
                v[off + 2] = bz;
                return;
            default:
                break;
        }
        double rx = v[off] - bx, ry = v[off + 1] - by, rz = v[off + 2] - bz;
        double nx = n[no], ny = n[no + 1], nz = n[no + 2];
        double vn = rx * nx + ry * ny + rz * nz;
        if (type == Type.SEPARATING && vn >= 0) {
            return;
        }
        double tx = rx - vn * nx, ty = ry - vn * ny, tz = rz - vn * nz;
        double vt = Math.sqrt(tx * tx + ty * ty + tz * tz);
        if (friction > 0 && vt > 0) {
            // Coulomb: the tangential speed drops by mu times the normal speed removed, never past zero.
            double scale = Math.max(0.0, vt - friction * Math.abs(vn)) / vt;
            tx *= scale;
            ty *= scale;
            tz *= scale;
        }
        v[off] = bx + tx;
        v[off + 1] = by + ty;
        v[off + 2] = bz + tz;
    }
}
