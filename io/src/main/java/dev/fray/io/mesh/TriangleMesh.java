package dev.fray.io.mesh;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * An immutable triangle mesh: vertex positions in m (stored in single or double precision), triangles as triples
 * of vertex indices, and optional named per-vertex attributes of width 1 (a scalar) or 3 (a vector, for example a
 * normal or a fiber direction).
 *
 * <p>Storage: positions are interleaved, vertex v at {@code 3v .. 3v+2}; triangle t's corners at {@code 3t .. 3t+2},
 * counter-clockwise seen from outside for an outward-oriented surface; an attribute of width w holds vertex v's
 * components at {@code wv .. wv+w-1}. Every index lies in [0, vertexCount) and every number is finite; the
 * factories check this. A triangle may repeat a vertex index (it then has no area and no edges; see
 * {@link MeshShape}).
 *
 * <p>The name is used in error messages: readers set it to the file name, the factories to "mesh".
 *
 * <p>Instances are immutable and thread-safe; accessors that return arrays return copies.
 */
public final class TriangleMesh {
    /** Name given by the factories when the caller gives none. */
    public static final String DEFAULT_NAME = "mesh";

    private final String name;
    private final float[] floatXyz;
    private final double[] doubleXyz;
    private final int vertexCount;
    private final int[] triangles;
    private final Map<String, double[]> attributes;
    private final Map<String, Integer> widths;

    /** Takes ownership of the arrays; callers have validated them. Exactly one of fx, dx is non-null. */
    TriangleMesh(String name, float[] fx, double[] dx, int[] triangles, Map<String, double[]> attributes,
                 Map<String, Integer> widths) {
        this.name = name;
        this.floatXyz = fx;
        this.doubleXyz = dx;
        this.vertexCount = (fx != null ? fx.length : dx.length) / 3;
        this.triangles = triangles;
        this.attributes = attributes;
        this.widths = widths;
    }

    /**
     * A mesh with double-precision positions and no attributes.
     *
     * @param positions vertex positions, m, 3 per vertex (input, copied)
     * @param triangles vertex indices, 3 per triangle (input, copied)
     * @return the mesh, named {@link #DEFAULT_NAME}
     * @throws InvalidInputException MISSING for null arrays, OUT_OF_RANGE for a length that is not a multiple of
     *         3 or an index outside [0, vertex count), NOT_FINITE for a NaN or infinite coordinate
     */
    public static TriangleMesh of(double[] positions, int[] triangles) {
        if (positions == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh vertex positions");
        }
        checkPositionLength(positions.length);
        for (int i = 0; i < positions.length; i++) {
            checkFinite(i, positions[i]);
        }
        int[] t = checkTriangles(triangles, positions.length / 3);
        return new TriangleMesh(DEFAULT_NAME, null, positions.clone(), t, Map.of(), Map.of());
    }

    /**
     * A mesh with single-precision positions and no attributes (half the memory of {@link #of(double[], int[])}).
     *
     * @param positions vertex positions, m, 3 per vertex (input, copied)
     * @param triangles vertex indices, 3 per triangle (input, copied)
     * @return the mesh, named {@link #DEFAULT_NAME}
     * @throws InvalidInputException as {@link #of(double[], int[])}
     */
    public static TriangleMesh of(float[] positions, int[] triangles) {
        if (positions == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh vertex positions");
        }
        checkPositionLength(positions.length);
        for (int i = 0; i < positions.length; i++) {
            checkFinite(i, positions[i]);
        }
        int[] t = checkTriangles(triangles, positions.length / 3);
        return new TriangleMesh(DEFAULT_NAME, positions.clone(), null, t, Map.of(), Map.of());
    }

    private static void checkPositionLength(int length) {
        if (length % 3 != 0) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "mesh vertex positions length", length,
                    "a multiple of 3 (x y z per vertex)");
        }
    }

    private static void checkFinite(int i, double value) {
        if (!Double.isFinite(value)) {
            throw new InvalidInputException(FrayMessage.NOT_FINITE,
                    "mesh vertex " + (i / 3) + " coordinate " + "xyz".charAt(i % 3) + " (m)", value);
        }
    }

    private static int[] checkTriangles(int[] triangles, int vertexCount) {
        if (triangles == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh triangles");
        }
        if (triangles.length % 3 != 0) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "mesh triangle index array length",
                    triangles.length, "a multiple of 3 (three corners per triangle)");
        }
        for (int i = 0; i < triangles.length; i++) {
            if (triangles[i] < 0 || triangles[i] >= vertexCount) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE,
                        "mesh triangle " + (i / 3) + " corner " + (i % 3) + " vertex index", triangles[i],
                        "[0, " + (vertexCount - 1) + "]");
            }
        }
        return triangles.clone();
    }

    /**
     * A copy of this mesh with one more per-vertex attribute (or with an attribute of the same name replaced).
     *
     * @param attribute attribute name, non-empty
     * @param width     components per vertex, 1 or 3
     * @param values    width values per vertex (input, copied), all finite
     * @return the new mesh
     * @throws InvalidInputException MISSING for a null or empty name or null values, OUT_OF_RANGE for a width
     *         other than 1 or 3 or a wrong length, NOT_FINITE for a NaN or infinite value
     */
    public TriangleMesh withAttribute(String attribute, int width, double[] values) {
        if (attribute == null || attribute.isEmpty()) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh attribute name");
        }
        if (width != 1 && width != 3) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "width of mesh attribute \"" + attribute
                    + "\"", width, "1 or 3");
        }
        if (values == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "values of mesh attribute \"" + attribute + "\"");
        }
        if (values.length != (long) width * vertexCount) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "length of mesh attribute \"" + attribute
                    + "\"", values.length, String.valueOf((long) width * vertexCount) + " (width x vertex count)");
        }
        for (int i = 0; i < values.length; i++) {
            if (!Double.isFinite(values[i])) {
                throw new InvalidInputException(FrayMessage.NOT_FINITE, "mesh attribute \"" + attribute
                        + "\" at vertex " + (i / width), values[i]);
            }
        }
        Map<String, double[]> a = new LinkedHashMap<>(attributes);
        Map<String, Integer> w = new LinkedHashMap<>(widths);
        a.put(attribute, values.clone());
        w.put(attribute, width);
        return new TriangleMesh(name, floatXyz, doubleXyz, triangles, Collections.unmodifiableMap(a),
                Collections.unmodifiableMap(w));
    }

    /**
     * @param newName name for error messages, e.g. a file name
     * @return a copy of this mesh with that name (the arrays are shared, being immutable)
     * @throws InvalidInputException MISSING for a null name
     */
    public TriangleMesh withName(String newName) {
        if (newName == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh name");
        }
        return new TriangleMesh(newName, floatXyz, doubleXyz, triangles, attributes, widths);
    }

    /**
     * A copy scaled about the origin and then moved: x' = scale x + offset, for meshes modelled in other units or
     * places. Name, triangles and attributes are kept (directions stay valid: a uniform positive scale does not
     * turn them).
     *
     * @param scale factor, finite and &gt; 0 (e.g. 0.001 for a mesh in mm)
     * @param dx    offset x, m
     * @param dy    offset y, m
     * @param dz    offset z, m
     * @return the transformed mesh, in double precision
     * @throws InvalidInputException OUT_OF_RANGE or NOT_FINITE for a bad scale or offset, or NOT_FINITE if a moved
     *         coordinate overflows
     */
    public TriangleMesh transformed(double scale, double dx, double dy, double dz) {
        dev.fray.core.error.Checks.positive("mesh scale", scale);
        dev.fray.core.error.Checks.finite("mesh offset x (m)", dx);
        dev.fray.core.error.Checks.finite("mesh offset y (m)", dy);
        dev.fray.core.error.Checks.finite("mesh offset z (m)", dz);
        double[] p = new double[3 * vertexCount];
        for (int v = 0; v < vertexCount; v++) {
            p[3 * v] = scale * x(v) + dx;
            p[3 * v + 1] = scale * y(v) + dy;
            p[3 * v + 2] = scale * z(v) + dz;
        }
        for (int i = 0; i < p.length; i++) {
            checkFinite(i, p[i]);
        }
        return new TriangleMesh(name, null, p, triangles, attributes, widths);
    }

    /**
     * Merges vertices at exactly the same position (after mapping -0.0 to 0.0) into one, keeping the first
     * vertex's attribute values; triangles keep their order. Use this for files that repeat vertices per face.
     *
     * @return the welded mesh (this mesh if no two vertices coincide)
     */
    public TriangleMesh welded() {
        VertexWelder w = new VertexWelder(vertexCount);
        int[] map = new int[vertexCount];
        for (int v = 0; v < vertexCount; v++) {
            map[v] = w.add(x(v), y(v), z(v));
        }
        int n = w.size();
        if (n == vertexCount) {
            return this;
        }
        int[] first = new int[n];
        java.util.Arrays.fill(first, -1);
        for (int v = 0; v < vertexCount; v++) {
            if (first[map[v]] < 0) {
                first[map[v]] = v;
            }
        }
        float[] fx = null;
        double[] dx = null;
        if (floatXyz != null) {
            fx = new float[3 * n];
            for (int i = 0; i < n; i++) {
                System.arraycopy(floatXyz, 3 * first[i], fx, 3 * i, 3);
            }
        } else {
            dx = new double[3 * n];
            for (int i = 0; i < n; i++) {
                System.arraycopy(doubleXyz, 3 * first[i], dx, 3 * i, 3);
            }
        }
        int[] t = new int[triangles.length];
        for (int i = 0; i < t.length; i++) {
            t[i] = map[triangles[i]];
        }
        Map<String, double[]> a = new LinkedHashMap<>();
        for (Map.Entry<String, double[]> e : attributes.entrySet()) {
            int width = widths.get(e.getKey());
            double[] src = e.getValue();
            double[] dst = new double[width * n];
            for (int i = 0; i < n; i++) {
                System.arraycopy(src, width * first[i], dst, width * i, width);
            }
            a.put(e.getKey(), dst);
        }
        return new TriangleMesh(name, fx, dx, t, Collections.unmodifiableMap(a), widths);
    }

    /** @return the name used in messages (the file name for meshes read from files) */
    public String name() {
        return name;
    }

    /** @return number of vertices */
    public int vertexCount() {
        return vertexCount;
    }

    /** @return number of triangles */
    public int triangleCount() {
        return triangles.length / 3;
    }

    /** @return whether positions are stored in single precision (as read from binary STL or float PLY) */
    public boolean singlePrecision() {
        return floatXyz != null;
    }

    /**
     * @param v vertex index
     * @return its x coordinate, m
     */
    public double x(int v) {
        return floatXyz != null ? floatXyz[3 * v] : doubleXyz[3 * v];
    }

    /**
     * @param v vertex index
     * @return its y coordinate, m
     */
    public double y(int v) {
        return floatXyz != null ? floatXyz[3 * v + 1] : doubleXyz[3 * v + 1];
    }

    /**
     * @param v vertex index
     * @return its z coordinate, m
     */
    public double z(int v) {
        return floatXyz != null ? floatXyz[3 * v + 2] : doubleXyz[3 * v + 2];
    }

    /**
     * @param t      triangle index
     * @param corner 0, 1 or 2
     * @return the vertex index at that corner
     */
    public int vertex(int t, int corner) {
        if (corner < 0 || corner > 2) {
            throw new IndexOutOfBoundsException("corner " + corner + " not in [0, 2]");
        }
        return triangles[3 * t + corner];
    }

    /** @return a copy of the positions in double precision, m, 3 per vertex */
    public double[] positions() {
        double[] out = new double[3 * vertexCount];
        if (floatXyz != null) {
            for (int i = 0; i < out.length; i++) {
                out[i] = floatXyz[i];
            }
        } else {
            System.arraycopy(doubleXyz, 0, out, 0, out.length);
        }
        return out;
    }

    /** @return a copy of the triangle corner indices, 3 per triangle */
    public int[] triangles() {
        return triangles.clone();
    }

    /** @return the attribute names, in the order they were added or read */
    public List<String> attributeNames() {
        return Collections.unmodifiableList(new ArrayList<>(attributes.keySet()));
    }

    /**
     * @param attribute attribute name
     * @return whether the mesh has it
     */
    public boolean hasAttribute(String attribute) {
        return attributes.containsKey(attribute);
    }

    /**
     * @param attribute attribute name
     * @return its width, 1 or 3
     * @throws InvalidInputException UNKNOWN_NAME if the mesh has no such attribute
     */
    public int attributeWidth(String attribute) {
        Integer w = widths.get(attribute);
        if (w == null) {
            throw unknown(attribute);
        }
        return w;
    }

    /**
     * @param attribute attribute name
     * @param v         vertex index
     * @param component component, in [0, width)
     * @return the value (in the unit the file gave it)
     * @throws InvalidInputException UNKNOWN_NAME if the mesh has no such attribute
     */
    public double attribute(String attribute, int v, int component) {
        double[] a = attributes.get(attribute);
        if (a == null) {
            throw unknown(attribute);
        }
        int w = widths.get(attribute);
        if (component < 0 || component >= w) {
            throw new IndexOutOfBoundsException("component " + component + " not in [0, " + (w - 1) + "]");
        }
        return a[w * v + component];
    }

    /**
     * @param attribute attribute name
     * @return a copy of its values, width per vertex
     * @throws InvalidInputException UNKNOWN_NAME if the mesh has no such attribute
     */
    public double[] attributeValues(String attribute) {
        double[] a = attributes.get(attribute);
        if (a == null) {
            throw unknown(attribute);
        }
        return a.clone();
    }

    /** Package-private access without a copy, for the mesh tools in this package (never modified). */
    double[] attributeArray(String attribute) {
        double[] a = attributes.get(attribute);
        if (a == null) {
            throw unknown(attribute);
        }
        return a;
    }

    /** Package-private access without a copy (never modified). */
    int[] triangleArray() {
        return triangles;
    }

    private InvalidInputException unknown(String attribute) {
        return new InvalidInputException(FrayMessage.UNKNOWN_NAME, "attribute of mesh \"" + name + "\"",
                attribute, attributes.isEmpty() ? "(none)" : String.join(", ", attributes.keySet()));
    }

    /** @return the smallest axis-aligned box containing every vertex, m ({@code NaN}s for an empty mesh) */
    public Bounds bounds() {
        if (vertexCount == 0) {
            return new Bounds(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN);
        }
        double x0 = Double.POSITIVE_INFINITY, y0 = x0, z0 = x0;
        double x1 = Double.NEGATIVE_INFINITY, y1 = x1, z1 = x1;
        for (int v = 0; v < vertexCount; v++) {
            double x = x(v), y = y(v), z = z(v);
            x0 = Math.min(x0, x);
            y0 = Math.min(y0, y);
            z0 = Math.min(z0, z);
            x1 = Math.max(x1, x);
            y1 = Math.max(y1, y);
            z1 = Math.max(z1, z);
        }
        return new Bounds(x0, y0, z0, x1, y1, z1);
    }

    @Override
    public String toString() {
        return "TriangleMesh[" + name + ", " + vertexCount + " vertices, " + triangleCount() + " triangles"
                + (attributes.isEmpty() ? "" : ", attributes " + widths) + "]";
    }
}
