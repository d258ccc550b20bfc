package dev.fray.io.mesh;

/**
 * Bounding-volume hierarchy over triangles, with the data for the fast generalised winding number.
 *
 * <p>Construction: each node's triangles are split at the median of their centroids along the longest axis of
 * the centroids' box, down to leaves of at most {@link #LEAF} triangles, so the depth is at most
 * ceil(log2(n)) + 1 whatever the geometry. Nodes are stored in depth-first order (left child = node + 1).
 *
 * <p>Winding data per node (the far-field expansion of Barill, Dickson, Schmidt, Levin and Jacobson 2018, "Fast
 * winding numbers for soups and clouds", to second order): area A, area-weighted centroid P, summed area vector
 * N = sum a_i n_i, the first moment M = sum (c_i - P) (a_i n_i)^T about P, and the radius r of a sphere about P
 * holding the node's box. Seen from a point q with y = P - q, the node's solid angle is approximated by
 * N.y / |y|^3 + tr(M) / |y|^3 - 3 y^T M y / |y|^5 when |y| &gt; beta r; otherwise the children are visited, and
 * the triangles of a leaf are summed exactly by the formula of Van Oosterom and Strackee 1983.
 *
 * <p>Nearest triangle: branch and bound, nearer child first, each subtree pruned by the larger of two lower
 * bounds of its distance, from its axis-aligned box and from an oriented box along its mean normal (thin for a
 * nearly flat patch). The search is exact.
 *
 * <p>Immutable after construction and safe for concurrent queries; each query allocates one small stack.
 */
final class TriangleTree {
    /** Largest number of triangles in a leaf. */
    static final int LEAF = 4;
    /** Per-node winding data: A, P (3), N (3), M (9, row-major), r. */
    private static final int WD = 17;
    /** Traversal stack; the depth bound in the class comment keeps it far below this. */
    private static final int STACK = 128;

    final int size;
    /** Triangle vertices in leaf order, 9 per slot. */
    final double[] v;
    /** Original triangle index of each slot. */
    final int[] id;
    /** Unit face normal of each slot (zero for a triangle without area). */
    final double[] fn;
    private final double[] box;
    private final int[] first;
    private final int[] count;
    private final double[] wd;
    /** Oriented box per node: for each of 3 orthonormal axes u, the range lo &lt;= u.x &lt;= hi (u, lo, hi). */
    private final double[] obb;
    private static final int OB = 15;
    private int nodes;

    /**
     * @param p   positions, 3 per vertex, m (not modified)
     * @param tri corner indices, 3 per triangle, at least one triangle (not modified)
     * @param ids original index of each triangle (not modified)
     */
    TriangleTree(double[] p, int[] tri, int[] ids) {
        size = tri.length / 3;
        double[] cen = new double[3 * size];
        for (int t = 0; t < size; t++) {
            for (int k = 0; k < 3; k++) {
                cen[3 * t + k] = (p[3 * tri[3 * t] + k] + p[3 * tri[3 * t + 1] + k] + p[3 * tri[3 * t + 2] + k]) / 3;
            }
        }
        int[] perm = new int[size];
        for (int t = 0; t < size; t++) {
            perm[t] = t;
        }
        int maxNodes = Math.max(1, 2 * size);
        box = new double[6 * maxNodes];
        first = new int[maxNodes];
        count = new int[maxNodes];
        wd = new double[WD * maxNodes];
        obb = new double[OB * maxNodes];
        build(0, size, perm, cen);
        v = new double[9 * size];
        id = new int[size];
        fn = new double[3 * size];
        for (int s = 0; s < size; s++) {
            int t = perm[s];
            id[s] = ids[t];
            for (int c = 0; c < 3; c++) {
                System.arraycopy(p, 3 * tri[3 * t + c], v, 9 * s + 3 * c, 3);
            }
            double[] a = areaVector(v, 9 * s);
            double len = Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
            if (len > 0) {
                fn[3 * s] = a[0] / len;
                fn[3 * s + 1] = a[1] / len;
                fn[3 * s + 2] = a[2] / len;
            }
        }
        finish(0);
    }

    /** Half the cross product of the edges: the triangle's area times its unit normal. */
    private static double[] areaVector(double[] v, int o) {
        double ux = v[o + 3] - v[o], uy = v[o + 4] - v[o + 1], uz = v[o + 5] - v[o + 2];
        double wx = v[o + 6] - v[o], wy = v[o + 7] - v[o + 1], wz = v[o + 8] - v[o + 2];
        return new double[] {0.5 * (uy * wz - uz * wy), 0.5 * (uz * wx - ux * wz), 0.5 * (ux * wy - uy * wx)};
    }

    private int build(int lo, int hi, int[] perm, double[] cen) {
        int node = nodes++;
        if (hi - lo <= LEAF) {
            first[node] = lo;
            count[node] = hi - lo;
            return node;
        }
        double[] cb = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY,
            Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (int i = lo; i < hi; i++) {
            for (int k = 0; k < 3; k++) {
                double c = cen[3 * perm[i] + k];
                cb[k] = Math.min(cb[k], c);
                cb[3 + k] = Math.max(cb[3 + k], c);
            }
        }
        double ex = cb[3] - cb[0], ey = cb[4] - cb[1], ez = cb[5] - cb[2];
        int axis = ex >= ey && ex >= ez ? 0 : ey >= ez ? 1 : 2;
        int mid = (lo + hi) >>> 1;
        select(perm, cen, axis, lo, hi - 1, mid);
        build(lo, mid, perm, cen);
        first[node] = build(mid, hi, perm, cen);
        count[node] = 0;
        return node;
    }

    /** Reorders perm[lo..hi] so that position k holds the k-th smallest key (three-way quickselect). */
    private static void select(int[] perm, double[] cen, int axis, int lo, int hi, int k) {
        while (hi > lo) {
            int m = (lo + hi) >>> 1;
            double a = cen[3 * perm[lo] + axis], b = cen[3 * perm[m] + axis], c = cen[3 * perm[hi] + axis];
            double pivot = Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
            // Dutch-flag partition: [lo, lt) < pivot, [lt, i) == pivot, (gt, hi] > pivot; equal keys cost nothing.
            int lt = lo, i = lo, gt = hi;
            while (i <= gt) {
                double x = cen[3 * perm[i] + axis];
                if (x < pivot) {
                    swap(perm, lt++, i++);
                } else if (x > pivot) {
                    swap(perm, i, gt--);
                } else {
                    i++;
                }
            }
            if (k < lt) {
                hi = lt - 1;
            } else if (k > gt) {
                lo = gt + 1;
            } else {
                return;
            }
        }
    }

    private static void swap(int[] a, int i, int j) {
        int t = a[i];
        a[i] = a[j];
        a[j] = t;
    }

    /**
     * Fills boxes, winding data and oriented boxes bottom-up.
     *
     * @return one past the last slot of the node's subtree (its slots are contiguous, from the first leaf's)
     */
    private int finish(int node) {
        int end;
        int b = 6 * node, w = WD * node;
        if (count[node] > 0) {
            box[b] = box[b + 1] = box[b + 2] = Double.POSITIVE_INFINITY;
            box[b + 3] = box[b + 4] = box[b + 5] = Double.NEGATIVE_INFINITY;
            double area = 0, px = 0, py = 0, pz = 0;
            for (int s = first[node]; s < first[node] + count[node]; s++) {
                for (int c = 0; c < 3; c++) {
                    for (int k = 0; k < 3; k++) {
                        double x = v[9 * s + 3 * c + k];
                        box[b + k] = Math.min(box[b + k], x);
                        box[b + 3 + k] = Math.max(box[b + 3 + k], x);
                    }
                }
                double[] a = areaVector(v, 9 * s);
                double ai = Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
                area += ai;
                px += ai * centroid(s, 0);
                py += ai * centroid(s, 1);
                pz += ai * centroid(s, 2);
                wd[w + 4] += a[0];
                wd[w + 5] += a[1];
                wd[w + 6] += a[2];
            }
            setCentre(node, area, px, py, pz);
            end = first[node] + count[node];
            for (int s = first[node]; s < first[node] + count[node]; s++) {
                double[] a = areaVector(v, 9 * s);
                for (int j = 0; j < 3; j++) {
                    double d = centroid(s, j) - wd[w + 1 + j];
                    for (int k = 0; k < 3; k++) {
                        wd[w + 7 + 3 * j + k] += d * a[k];
                    }
                }
            }
        } else {
            int l = node + 1, r = first[node];
            finish(l);
            end = finish(r);
            for (int k = 0; k < 3; k++) {
                box[b + k] = Math.min(box[6 * l + k], box[6 * r + k]);
                box[b + 3 + k] = Math.max(box[6 * l + 3 + k], box[6 * r + 3 + k]);
            }
            int wl = WD * l, wr = WD * r;
            double al = wd[wl], ar = wd[wr];
            setCentre(node, al + ar, al * wd[wl + 1] + ar * wd[wr + 1], al * wd[wl + 2] + ar * wd[wr + 2],
                    al * wd[wl + 3] + ar * wd[wr + 3]);
            for (int k = 0; k < 3; k++) {
                wd[w + 4 + k] = wd[wl + 4 + k] + wd[wr + 4 + k];
            }
            // Shift each child's moment from its centre to this node's: M += (P_child - P) N_child^T.
            for (int j = 0; j < 3; j++) {
                double dl = wd[wl + 1 + j] - wd[w + 1 + j], dr = wd[wr + 1 + j] - wd[w + 1 + j];
                for (int k = 0; k < 3; k++) {
                    wd[w + 7 + 3 * j + k] = wd[wl + 7 + 3 * j + k] + dl * wd[wl + 4 + k]
                            + wd[wr + 7 + 3 * j + k] + dr * wd[wr + 4 + k];
                }
            }
        }
        // Radius: farthest box corner from P, so the sphere holds every triangle of the node.
        double r2 = 0;
        for (int c = 0; c < 8; c++) {
            double dx = box[b + ((c & 1) == 0 ? 0 : 3)] - wd[w + 1];
            double dy = box[b + 1 + ((c & 2) == 0 ? 0 : 3)] - wd[w + 2];
            double dz = box[b + 2 + ((c & 4) == 0 ? 0 : 3)] - wd[w + 3];
            r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
        }
        wd[w + 16] = Math.sqrt(r2);
        setOrientedBox(node, firstSlot(node), end);
        return end;
    }

    private int firstSlot(int node) {
        while (count[node] == 0) {
            node++; // the left child, down to the leftmost leaf
        }
        return first[node];
    }

    /**
     * An oriented box whose first axis is the node's mean normal (its summed area vector) and whose other two are
     * perpendicular to it. For a nearly flat patch it is thin, and it bounds the distance to the patch far more
     * tightly than the axis-aligned box of a tilted patch; that lets the nearest search prune the many nearly
     * equidistant leaves seen from inside (or just outside) a rounded solid.
     */
    private void setOrientedBox(int node, int from, int to) {
        int w = WD * node, o = OB * node;
        double nx = wd[w + 4], ny = wd[w + 5], nz = wd[w + 6];
        double len = Math.sqrt(nx * nx + ny * ny + nz * nz);
        if (!(len > 0)) {
            nx = 1;
            ny = 0;
            nz = 0;
            len = 1;
        }
        nx /= len;
        ny /= len;
        nz /= len;
        // t = the coordinate axis least aligned with n, made perpendicular; b = n x t.
        double ax = Math.abs(nx), ay = Math.abs(ny), az = Math.abs(nz);
        double tx = ax <= ay && ax <= az ? 1 : 0, ty = tx == 0 && ay <= az ? 1 : 0, tz = tx == 0 && ty == 0 ? 1 : 0;
        double dot = tx * nx + ty * ny + tz * nz;
        tx -= dot * nx;
        ty -= dot * ny;
        tz -= dot * nz;
        double tl = Math.sqrt(tx * tx + ty * ty + tz * tz);
        tx /= tl;
        ty /= tl;
        tz /= tl;
        double bx = ny * tz - nz * ty, by = nz * tx - nx * tz, bz = nx * ty - ny * tx;
        double[] axes = {nx, ny, nz, tx, ty, tz, bx, by, bz};
        for (int k = 0; k < 3; k++) {
            double ux = axes[3 * k], uy = axes[3 * k + 1], uz = axes[3 * k + 2];
            double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
            for (int i = 9 * from; i < 9 * to; i += 3) {
                double d = ux * v[i] + uy * v[i + 1] + uz * v[i + 2];
                lo = Math.min(lo, d);
                hi = Math.max(hi, d);
            }
            // Widen by a rounding margin so the bound never exceeds the exactly computed distance.
            double margin = 1e-12 * Math.max(Math.abs(lo), Math.abs(hi)) + 1e-300;
            obb[o + 5 * k] = ux;
            obb[o + 5 * k + 1] = uy;
            obb[o + 5 * k + 2] = uz;
            obb[o + 5 * k + 3] = lo - margin;
            obb[o + 5 * k + 4] = hi + margin;
        }
    }

    private void setCentre(int node, double area, double px, double py, double pz) {
        int b = 6 * node, w = WD * node;
        wd[w] = area;
        if (area > 0) {
            wd[w + 1] = px / area;
            wd[w + 2] = py / area;
            wd[w + 3] = pz / area;
        } else {
            wd[w + 1] = 0.5 * (box[b] + box[b + 3]);
            wd[w + 2] = 0.5 * (box[b + 1] + box[b + 4]);
            wd[w + 3] = 0.5 * (box[b + 2] + box[b + 5]);
        }
    }

    private double centroid(int s, int k) {
        return (v[9 * s + k] + v[9 * s + 3 + k] + v[9 * s + 6 + k]) / 3;
    }

    /** @return the box of the root: min x y z, max x y z */
    double[] rootBox() {
        return java.util.Arrays.copyOf(box, 6);
    }

    // ------------------------------------------------------------------ winding number

    /**
     * Solid angle of triangle slot s seen from q, in sr, positive when q is behind the triangle (on the side
     * opposite its normal). Van Oosterom and Strackee 1983: tan(omega / 2) = a.(b x c) / (|a||b||c| + (a.b)|c|
     * + (a.c)|b| + (b.c)|a|) with a, b, c the corners relative to q.
     */
    double solidAngle(int s, double qx, double qy, double qz) {
        int o = 9 * s;
        double ax = v[o] - qx, ay = v[o + 1] - qy, az = v[o + 2] - qz;
        double bx = v[o + 3] - qx, by = v[o + 4] - qy, bz = v[o + 5] - qz;
        double cx = v[o + 6] - qx, cy = v[o + 7] - qy, cz = v[o + 8] - qz;
        double la = Math.sqrt(ax * ax + ay * ay + az * az);
        double lb = Math.sqrt(bx * bx + by * by + bz * bz);
        double lc = Math.sqrt(cx * cx + cy * cy + cz * cz);
        double det = ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx);
        double den = la * lb * lc + (ax * bx + ay * by + az * bz) * lc + (ax * cx + ay * cy + az * cz) * lb
                + (bx * cx + by * cy + bz * cz) * la;
        return 2 * Math.atan2(det, den);
    }

    /**
     * @param qx    query point, m
     * @param qy    query point, m
     * @param qz    query point, m
     * @param beta2 square of the far-field ratio beta; infinity for the exact sum
     * @return the generalised winding number: the summed solid angle over 4 pi
     */
    double winding(double qx, double qy, double qz, double beta2) {
        int[] stack = new int[STACK];
        int sp = 0;
        stack[sp++] = 0;
        double omega = 0;
        while (sp > 0) {
            int node = stack[--sp];
            int w = WD * node;
            double yx = wd[w + 1] - qx, yy = wd[w + 2] - qy, yz = wd[w + 3] - qz;
            double d2 = yx * yx + yy * yy + yz * yz;
            double r = wd[w + 16];
            if (d2 > beta2 * r * r) {
                double inv2 = 1 / d2;
                double inv3 = inv2 * Math.sqrt(inv2);
                double yn = yx * wd[w + 4] + yy * wd[w + 5] + yz * wd[w + 6];
                double tr = wd[w + 7] + wd[w + 11] + wd[w + 15];
                double yMy = yx * (wd[w + 7] * yx + wd[w + 8] * yy + wd[w + 9] * yz)
                        + yy * (wd[w + 10] * yx + wd[w + 11] * yy + wd[w + 12] * yz)
                        + yz * (wd[w + 13] * yx + wd[w + 14] * yy + wd[w + 15] * yz);
                omega += (yn + tr) * inv3 - 3 * yMy * inv3 * inv2;
            } else if (count[node] > 0) {
                for (int s = first[node], e = s + count[node]; s < e; s++) {
                    omega += solidAngle(s, qx, qy, qz);
                }
            } else {
                stack[sp++] = first[node];
                stack[sp++] = node + 1;
            }
        }
        return omega / (4 * Math.PI);
    }

    // ------------------------------------------------------------------ nearest triangle

    /**
     * Nearest triangle by branch and bound: nearer child first, subtrees pruned by their box distance.
     *
     * @param qx  query point, m
     * @param qy  query point, m
     * @param qz  query point, m
     * @param out (output) closest point at out[0..2] and its barycentric weights of the slot's corners at
     *            out[3..5]
     * @return the slot of the nearest triangle, -1 for a NaN query; out[6] gets the squared distance, m^2
     */
    int nearest(double qx, double qy, double qz, double[] out) {
        int[] stack = new int[STACK];
        int sp = 0;
        stack[sp++] = 0;
        double best = Double.POSITIVE_INFINITY;
        int bestSlot = -1;
        double bu = 1, bv = 0, bw = 0;
        double[] tmp = new double[3];
        while (sp > 0) {
            int node = stack[--sp];
            if (boxDistance2(node, qx, qy, qz) >= best) {
                continue;
            }
            if (count[node] > 0) {
                for (int s = first[node], e = s + count[node]; s < e; s++) {
                    double d2 = closest(s, qx, qy, qz, tmp);
                    if (d2 < best) {
                        best = d2;
                        bestSlot = s;
                        bu = tmp[0];
                        bv = tmp[1];
                        bw = tmp[2];
                    }
                }
            } else {
                int l = node + 1, r = first[node];
                double dl = boxDistance2(l, qx, qy, qz), dr = boxDistance2(r, qx, qy, qz);
                // Push the farther child first so the nearer one is searched first and tightens the bound.
                if (dl <= dr) {
                    if (dr < best) {
                        stack[sp++] = r;
                    }
                    if (dl < best) {
                        stack[sp++] = l;
                    }
                } else {
                    if (dl < best) {
                        stack[sp++] = l;
                    }
                    if (dr < best) {
                        stack[sp++] = r;
                    }
                }
            }
        }
        if (bestSlot < 0) {
            return -1; // only for a NaN query point
        }
        int o = 9 * bestSlot;
        for (int k = 0; k < 3; k++) {
            out[k] = bu * v[o + k] + bv * v[o + 3 + k] + bw * v[o + 6 + k];
        }
        out[3] = bu;
        out[4] = bv;
        out[5] = bw;
        out[6] = best;
        return bestSlot;
    }

    /** Lower bound of the squared distance from q to the node's triangles: the larger of the two box bounds. */
    private double boxDistance2(int node, double qx, double qy, double qz) {
        int b = 6 * node;
        double dx = Math.max(Math.max(box[b] - qx, qx - box[b + 3]), 0);
        double dy = Math.max(Math.max(box[b + 1] - qy, qy - box[b + 4]), 0);
        double dz = Math.max(Math.max(box[b + 2] - qz, qz - box[b + 5]), 0);
        int o = OB * node;
        double s0 = obb[o] * qx + obb[o + 1] * qy + obb[o + 2] * qz;
        double s1 = obb[o + 5] * qx + obb[o + 6] * qy + obb[o + 7] * qz;
        double s2 = obb[o + 10] * qx + obb[o + 11] * qy + obb[o + 12] * qz;
        double e0 = Math.max(Math.max(obb[o + 3] - s0, s0 - obb[o + 4]), 0);
        double e1 = Math.max(Math.max(obb[o + 8] - s1, s1 - obb[o + 9]), 0);
        double e2 = Math.max(Math.max(obb[o + 13] - s2, s2 - obb[o + 14]), 0);
        return Math.max(dx * dx + dy * dy + dz * dz, e0 * e0 + e1 * e1 + e2 * e2);
    }

    /**
     * Closest point of triangle slot s to q by the Voronoi-region method (Ericson 2005, "Real-Time Collision
     * Detection", section 5.1.5); triangles without area fall back to their three edges.
     *
     * @param bary (output) barycentric weights of the closest point
     * @return squared distance, m^2
     */
    private double closest(int s, double px, double py, double pz, double[] bary) {
        int o = 9 * s;
        double ax = v[o], ay = v[o + 1], az = v[o + 2];
        double bx = v[o + 3], by = v[o + 4], bz = v[o + 5];
        double cx = v[o + 6], cy = v[o + 7], cz = v[o + 8];
        if (fn[3 * s] == 0 && fn[3 * s + 1] == 0 && fn[3 * s + 2] == 0) {
            return closestOnEdges(s, px, py, pz, bary);
        }
        double abx = bx - ax, aby = by - ay, abz = bz - az;
        double acx = cx - ax, acy = cy - ay, acz = cz - az;
        double apx = px - ax, apy = py - ay, apz = pz - az;
        double d1 = abx * apx + aby * apy + abz * apz;
        double d2 = acx * apx + acy * apy + acz * apz;
        double u, vv, w;
        if (d1 <= 0 && d2 <= 0) {
            u = 1;
            vv = 0;
            w = 0;
        } else {
            double bpx = px - bx, bpy = py - by, bpz = pz - bz;
            double d3 = abx * bpx + aby * bpy + abz * bpz;
            double d4 = acx * bpx + acy * bpy + acz * bpz;
            double cpx = px - cx, cpy = py - cy, cpz = pz - cz;
            double d5 = abx * cpx + aby * cpy + abz * cpz;
            double d6 = acx * cpx + acy * cpy + acz * cpz;
            double vc = d1 * d4 - d3 * d2;
            double vb = d5 * d2 - d1 * d6;
            double va = d3 * d6 - d5 * d4;
            if (d3 >= 0 && d4 <= d3) {
                u = 0;
                vv = 1;
                w = 0;
            } else if (vc <= 0 && d1 >= 0 && d3 <= 0) {
                double t = d1 / (d1 - d3);
                u = 1 - t;
                vv = t;
                w = 0;
            } else if (d6 >= 0 && d5 <= d6) {
                u = 0;
                vv = 0;
                w = 1;
            } else if (vb <= 0 && d2 >= 0 && d6 <= 0) {
                double t = d2 / (d2 - d6);
                u = 1 - t;
                vv = 0;
                w = t;
            } else if (va <= 0 && (d4 - d3) >= 0 && (d5 - d6) >= 0) {
                double t = (d4 - d3) / ((d4 - d3) + (d5 - d6));
                u = 0;
                vv = 1 - t;
                w = t;
            } else {
                double den = 1 / (va + vb + vc);
                vv = vb * den;
                w = vc * den;
                u = 1 - vv - w;
            }
            if (!(Double.isFinite(u) && Double.isFinite(vv) && Double.isFinite(w))) {
                return closestOnEdges(s, px, py, pz, bary);
            }
        }
        bary[0] = u;
        bary[1] = vv;
        bary[2] = w;
        double qx = u * ax + vv * bx + w * cx - px;
        double qy = u * ay + vv * by + w * cy - py;
        double qz = u * az + vv * bz + w * cz - pz;
        return qx * qx + qy * qy + qz * qz;
    }

    /** Closest point on the three edges of slot s (for triangles without area). */
    private double closestOnEdges(int s, double px, double py, double pz, double[] bary) {
        int o = 9 * s;
        double best = Double.POSITIVE_INFINITY;
        for (int e = 0; e < 3; e++) {
            int i = e, j = (e + 1) % 3;
            double ax = v[o + 3 * i], ay = v[o + 3 * i + 1], az = v[o + 3 * i + 2];
            double dx = v[o + 3 * j] - ax, dy = v[o + 3 * j + 1] - ay, dz = v[o + 3 * j + 2] - az;
            double len2 = dx * dx + dy * dy + dz * dz;
            double t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy + (pz - az) * dz) / len2 : 0;
            t = Math.max(0, Math.min(1, t));
            double qx = ax + t * dx - px, qy = ay + t * dy - py, qz = az + t * dz - pz;
            double d2 = qx * qx + qy * qy + qz * qz;
            if (d2 < best) {
                best = d2;
                bary[0] = bary[1] = bary[2] = 0;
                bary[i] = 1 - t;
                bary[j] = t;
            }
        }
        return best;
    }
}
