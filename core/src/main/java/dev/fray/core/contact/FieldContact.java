package dev.fray.core.contact;

import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;

/**
 * Frictional contact between two velocity fields at a node (Bardenhagen, Brackbill and Sulsky, CMAME 187, 2000;
 * Bardenhagen et al., CMES 2, 2001), after each field's own grid update. With n the unit normal from field 0
 * towards field 1, v_cm = (m_0 v_0 + m_1 v_1) / (m_0 + m_1) and d = v_0 - v_cm: if the fields approach,
 * (v_0 - v_1) . n &gt; 0, the normal part of d is removed and its tangential part t = d - (d . n) n is reduced by
 * Coulomb friction to t max(0, 1 - mu (d . n) / |t|); v_0 = v_cm + t', v_1 = v_cm - (m_0 / m_1) t', which keeps
 * the node's momentum. Fields that separate are left free. The energy the contact removes from the node's kinetic
 * energy (inelastic normal impact and friction) is tallied per task.
 */
public final class FieldContact {
    private final double friction;

    /** @param friction Coulomb coefficient between the fields, &gt;= 0 */
    public FieldContact(double friction) {
        this.friction = friction;
    }

    /**
     * Applies the contact on grid blocks [b0, b1).
     *
     * @param fields  the two fields (velocities)
     * @param normals normal per node, 3 per node, pointing from field 0 to field 1 (any length)
     * @param len2    squared length of each normal, 0 where the node does not split
     * @param b0      first grid block
     * @param b1      end grid block, exclusive
     * @return kinetic energy removed, J
     */
    public double apply(FieldSet fields, double[] normals, double[] len2, int b0, int b1) {
        double[] ma = fields.mass(0);
        double[] va = fields.momentum(0);
        double[] mb = fields.mass(1);
        double[] vb = fields.momentum(1);
        double loss = 0;
        for (int node = b0 * SparseGrid.NODES_PER_BLOCK, e = b1 * SparseGrid.NODES_PER_BLOCK; node < e; node++) {
            double mA = ma[node], mB = mb[node];
            if (mA <= 0 || mB <= 0 || len2[node] == 0) {
                continue;
            }
            int n3 = 3 * node;
            double len = 1 / Math.sqrt(len2[node]);
            double nx = normals[n3] * len, ny = normals[n3 + 1] * len, nz = normals[n3 + 2] * len;
            double approach = (va[n3] - vb[n3]) * nx + (va[n3 + 1] - vb[n3 + 1]) * ny
                    + (va[n3 + 2] - vb[n3 + 2]) * nz;
            if (!(approach > 0)) {
                continue;
            }
            double before = mA * (va[n3] * va[n3] + va[n3 + 1] * va[n3 + 1] + va[n3 + 2] * va[n3 + 2])
                    + mB * (vb[n3] * vb[n3] + vb[n3 + 1] * vb[n3 + 1] + vb[n3 + 2] * vb[n3 + 2]);
            double total = mA + mB;
            double cx = (mA * va[n3] + mB * vb[n3]) / total;
            double cy = (mA * va[n3 + 1] + mB * vb[n3 + 1]) / total;
            double cz = (mA * va[n3 + 2] + mB * vb[n3 + 2]) / total;
            double dx = va[n3] - cx, dy = va[n3 + 1] - cy, dz = va[n3 + 2] - cz;
            double dn = dx * nx + dy * ny + dz * nz;
            double tx = dx - dn * nx, ty = dy - dn * ny, tz = dz - dn * nz;
            double t = Math.sqrt(tx * tx + ty * ty + tz * tz);
            // Coulomb: the tangential slip shrinks by mu times the normal velocity jump removed, not past zero.
            double keep = t > friction * dn ? 1 - friction * dn / t : 0;
            tx *= keep;
            ty *= keep;
            tz *= keep;
            double ratio = mA / mB;
            va[n3] = cx + tx;
            va[n3 + 1] = cy + ty;
            va[n3 + 2] = cz + tz;
            vb[n3] = cx - ratio * tx;
            vb[n3 + 1] = cy - ratio * ty;
            vb[n3 + 2] = cz - ratio * tz;
            double after = mA * (va[n3] * va[n3] + va[n3 + 1] * va[n3 + 1] + va[n3 + 2] * va[n3 + 2])
                    + mB * (vb[n3] * vb[n3] + vb[n3 + 1] * vb[n3 + 1] + vb[n3 + 2] * vb[n3 + 2]);
            loss += 0.5 * (before - after);
        }
        return loss;
    }
}
