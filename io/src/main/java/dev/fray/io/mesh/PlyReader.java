package dev.fray.io.mesh;

import dev.fray.core.error.InvalidInputException;

import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Reads PLY files (the open polygon file format, version 1.0) in the ascii, binary_little_endian and
 * binary_big_endian encodings.
 *
 * <p>The {@code vertex} element must have scalar properties {@code x y z} (positions, m). Every other scalar
 * property of the vertex element, of any numeric type, becomes a per-vertex attribute: three adjacent properties
 * named {@code Px Py Pz} form one attribute of width 3 named P (a trailing '_' dropped), so {@code nx ny nz}
 * gives "n", {@code fx fy fz} gives "f" and {@code fiber_x fiber_y fiber_z} gives "fiber"; any other property
 * gives a width-1 attribute of its own name. The {@code face} element must have a list property
 * {@code vertex_indices} (or {@code vertex_index}) of an integer type; faces of more than three vertices are
 * split into a fan around their first vertex. List properties of the vertex element, other face properties and
 * other elements are read past and ignored, as are bytes after the last element. Positions are kept in single
 * precision when x, y and z are all {@code float}, else in double precision; ASCII values of {@code float}
 * properties are rounded to single precision as the binary encodings store them.
 *
 * <p>Before allocating anything, the element counts of the header are checked against the bytes that follow it
 * (each binary item needs at least its fixed-size fields, each ASCII value at least two characters), so a
 * header declaring more data than the file holds is rejected at once and memory stays proportional to the file.
 *
 * <p>Errors are {@link InvalidInputException}s with key FILE_ERROR (file, reason) naming the header line, the
 * ASCII line or the binary byte offset: a malformed header, an unknown type, missing x y z or vertex_indices,
 * declared counts the file cannot hold, a truncated file, a non-finite position or attribute, an index out of
 * range, an integer outside its declared type, a face of fewer than three vertices, or no triangles.
 */
public final class PlyReader {
    private static final String[][] TYPE_NAMES = {{"char", "int8"}, {"uchar", "uint8"}, {"short", "int16"},
        {"ushort", "uint16"}, {"int", "int32"}, {"uint", "uint32"}, {"float", "float32"}, {"double", "float64"}};
    private static final int INT8 = 0;
    private static final int UINT8 = 1;
    private static final int INT16 = 2;
    private static final int UINT16 = 3;
    private static final int INT32 = 4;
    private static final int UINT32 = 5;
    private static final int FLOAT32 = 6;
    private static final int FLOAT64 = 7;
    private static final int[] SIZE = {1, 1, 2, 2, 4, 4, 4, 8};
    private static final long[] MIN = {-128, 0, -32768, 0, Integer.MIN_VALUE, 0};
    private static final long[] MAX = {127, 255, 32767, 65535, Integer.MAX_VALUE, 0xffffffffL};

    private static final int ASCII = 0;
    private static final int LITTLE = 1;
    private static final int BIG = 2;

    private PlyReader() {
    }

    /**
     * @param file the .ply file
     * @return the mesh with its vertex attributes, named after the file
     * @throws InvalidInputException FILE_ERROR (file, reason) if the file cannot be read or is malformed
     */
    public static TriangleMesh read(Path file) {
        return parse(MeshBytes.read(file), file.toString());
    }

    /**
     * @param in   the PLY bytes (read to the end, not closed)
     * @param name name for messages and for the mesh
     * @return the mesh with its vertex attributes
     * @throws InvalidInputException FILE_ERROR (name, reason) if the stream cannot be read or is malformed
     */
    public static TriangleMesh read(InputStream in, String name) {
        return parse(MeshBytes.read(in, name), name);
    }

    /** A property of an element: scalar, or list with a count type. */
    private record Property(String name, int type, boolean list, int countType, String label, String countLabel) {
        Property(String name, int type, boolean list, int countType) {
            // Labels are built once here, so the per-value calls pass them without building strings.
            this(name, type, list, countType, "property " + quote(name), "count of list " + quote(name));
        }
    }

    /** An element of the header. */
    private static final class Element {
        final String name;
        final long count;
        final int line;
        final List<Property> props = new ArrayList<>();

        Element(String name, long count, int line) {
            this.name = name;
            this.count = count;
            this.line = line;
        }
    }

    // ------------------------------------------------------------------ header

    private static TriangleMesh parse(byte[] b, String name) {
        int pos = 0;
        int line = 0;
        int format = -1;
        List<Element> elements = new ArrayList<>();
        boolean ended = false;
        while (pos < b.length) {
            int s = pos;
            while (pos < b.length && b[pos] != '\n') {
                pos++;
            }
            int e = pos;
            if (pos < b.length) {
                pos++; // past the '\n'
            }
            line++;
            if (e > s && b[e - 1] == '\r') {
                e--;
            }
            String text = new String(b, s, e - s, StandardCharsets.ISO_8859_1);
            if (line == 1) {
                if (!text.equals("ply")) {
                    throw MeshBytes.error(name, "line 1", "not a PLY file: the first line must be \"ply\", got "
                            + MeshBytes.quote(b, s, e));
                }
                continue;
            }
            String[] w = text.trim().split("[ \t]+");
            String kw = w[0];
            if (kw.equals("comment") || kw.equals("obj_info") || (kw.isEmpty() && w.length == 1)) {
                continue;
            }
            switch (kw) {
                case "format" -> {
                    if (format >= 0) {
                        throw header(name, line, "a second \"format\" line");
                    }
                    if (w.length != 3) {
                        throw header(name, line, "expected \"format <encoding> 1.0\"");
                    }
                    format = switch (w[1]) {
                        case "ascii" -> ASCII;
                        case "binary_little_endian" -> LITTLE;
                        case "binary_big_endian" -> BIG;
                        default -> throw header(name, line, "unknown encoding " + quote(w[1])
                                + "; allowed: ascii, binary_little_endian, binary_big_endian");
                    };
                    if (!w[2].equals("1.0")) {
                        throw header(name, line, "unsupported version " + quote(w[2]) + "; allowed: 1.0");
                    }
                }
                case "element" -> {
                    if (w.length != 3) {
                        throw header(name, line, "expected \"element <name> <count>\"");
                    }
                    long count = count(name, line, w[2]);
                    elements.add(new Element(w[1], count, line));
                }
                case "property" -> {
                    if (elements.isEmpty()) {
                        throw header(name, line, "a property before any element");
                    }
                    Element el = elements.get(elements.size() - 1);
                    Property p;
                    if (w.length >= 2 && w[1].equals("list")) {
                        if (w.length != 5) {
                            throw header(name, line, "expected \"property list <count type> <item type> <name>\"");
                        }
                        int ct = type(name, line, w[2]);
                        if (ct >= FLOAT32) {
                            throw header(name, line, "the count type of list " + quote(w[4])
                                    + " must be an integer type, got " + w[2]);
                        }
                        p = new Property(w[4], type(name, line, w[3]), true, ct);
                    } else {
                        if (w.length != 3) {
                            throw header(name, line, "expected \"property <type> <name>\"");
                        }
                        p = new Property(w[2], type(name, line, w[1]), false, -1);
                    }
                    for (Property q : el.props) {
                        if (q.name.equals(p.name)) {
                            throw header(name, line, "property " + quote(p.name) + " of element "
                                    + quote(el.name) + " is declared twice");
                        }
                    }
                    el.props.add(p);
                }
                case "end_header" -> {
                    if (w.length != 1) {
                        throw header(name, line, "unexpected text after end_header");
                    }
                    ended = true;
                }
                default -> throw header(name, line, "unknown header keyword " + quote(kw)
                        + "; allowed: format, element, property, comment, obj_info, end_header");
            }
            if (ended) {
                break;
            }
        }
        if (!ended) {
            throw line == 0 ? MeshBytes.error(name, "line 1", "empty file, not a PLY file")
                    : header(name, line, "the header has no end_header line");
        }
        if (format < 0) {
            throw header(name, line, "the header has no format line");
        }
        return body(b, pos, line + 1, name, format, elements);
    }

    private static InvalidInputException header(String name, int line, String reason) {
        return MeshBytes.error(name, "header line " + line, reason);
    }

    private static String quote(String s) {
        byte[] b = s.getBytes(StandardCharsets.ISO_8859_1);
        return MeshBytes.quote(b, 0, b.length);
    }

    private static long count(String name, int line, String s) {
        if (!s.matches("[0-9]{1,18}")) {
            throw header(name, line, "element count " + quote(s) + " must be a non-negative integer");
        }
        long n = Long.parseLong(s);
        if (n > Integer.MAX_VALUE) {
            throw header(name, line, "element count " + n + " is out of range: allowed 0 to " + Integer.MAX_VALUE);
        }
        return n;
    }

    private static int type(String name, int line, String s) {
        for (int t = 0; t < TYPE_NAMES.length; t++) {
            if (TYPE_NAMES[t][0].equals(s) || TYPE_NAMES[t][1].equals(s)) {
                return t;
            }
        }
        throw header(name, line, "unknown property type " + quote(s) + "; allowed: char uchar short ushort int uint"
                + " float double (or int8 uint8 int16 uint16 int32 uint32 float32 float64)");
    }

    // ------------------------------------------------------------------ data

    private static TriangleMesh body(byte[] b, int start, int firstLine, String name, int format,
                                     List<Element> elements) {
        Element vertex = null;
        Element face = null;
        for (Element el : elements) {
            if (el.name.equals("vertex") || el.name.equals("face")) {
                if ((el.name.equals("vertex") ? vertex : face) != null) {
                    throw header(name, el.line, "a second " + quote(el.name) + " element");
                }
                if (el.name.equals("vertex")) {
                    vertex = el;
                } else {
                    face = el;
                }
            }
        }
        if (vertex == null) {
            throw header(name, firstLine - 1, "no \"vertex\" element in the header");
        }
        if (face == null) {
            throw header(name, firstLine - 1, "no \"face\" element in the header; a mesh needs triangles");
        }
        VertexLayout layout = new VertexLayout(name, vertex);
        int faceList = -1;
        for (int i = 0; i < face.props.size(); i++) {
            Property p = face.props.get(i);
            if (p.list && (p.name.equals("vertex_indices") || p.name.equals("vertex_index"))) {
                faceList = i;
            }
        }
        if (faceList < 0) {
            throw header(name, face.line, "the face element has no list property \"vertex_indices\" (or"
                    + " \"vertex_index\")");
        }
        if (face.props.get(faceList).type >= FLOAT32) {
            throw header(name, face.line, "vertex_indices must have an integer item type, got "
                    + TYPE_NAMES[face.props.get(faceList).type][0]);
        }
        checkSize(b, start, name, format, elements);

        Source src = format == ASCII ? new AsciiSource(b, start, name, firstLine)
                : new BinarySource(b, start, name, format == BIG);
        int nv = (int) vertex.count;
        float[] fxyz = layout.floatPositions ? new float[3 * nv] : null;
        double[] dxyz = layout.floatPositions ? null : new double[3 * nv];
        double[][] attr = new double[layout.names.size()][];
        for (int a = 0; a < attr.length; a++) {
            attr[a] = new double[layout.widths.get(a) * nv];
        }
        IntList tri = new IntList();
        int[] poly = new int[16];
        for (Element el : elements) {
            if (el.props.isEmpty()) {
                continue; // nothing to read, however large the count
            }
            for (long item = 0; item < el.count; item++) {
                for (int pi = 0; pi < el.props.size(); pi++) {
                    Property p = el.props.get(pi);
                    if (el == vertex && !p.list) {
                        double v = src.scalar(p.type, p.label);
                        if (!Double.isFinite(v)) {
                            throw src.error("vertex " + item + " property " + quote(p.name)
                                    + " must be a finite number, got " + v);
                        }
                        int slot = layout.slot[pi];
                        if (slot < 3) {
                            if (fxyz != null) {
                                fxyz[3 * (int) item + slot] = (float) v;
                            } else {
                                dxyz[3 * (int) item + slot] = v;
                            }
                        } else {
                            int a = layout.attribute[pi];
                            attr[a][layout.widths.get(a) * (int) item + layout.component[pi]] = v;
                        }
                    } else if (p.list) {
                        long k = src.integer(p.countType, p.countLabel);
                        if (k < 0) {
                            throw src.error("list " + quote(p.name) + " of " + el.name + " " + item
                                    + " has a negative count " + k);
                        }
                        if (!src.fits(k, SIZE[p.type])) {
                            throw src.error("list " + quote(p.name) + " of " + el.name + " " + item + " declares "
                                    + k + " items, more than the rest of the file can hold");
                        }
                        if (el == face && pi == faceList) {
                            if (k < 3) {
                                throw src.error("face " + item + " has " + k + " vertices; at least 3 are needed");
                            }
                            if (k > poly.length) {
                                poly = new int[(int) k];
                            }
                            for (int j = 0; j < k; j++) {
                                long v = src.integer(p.type, "vertex index");
                                if (v < 0 || v >= nv) {
                                    throw src.error("face " + item + " refers to vertex " + v
                                            + "; allowed 0 to " + (nv - 1) + " (" + nv + " vertices)");
                                }
                                poly[j] = (int) v;
                            }
                            for (int j = 1; j + 1 < k; j++) {
                                tri.add(poly[0]);
                                tri.add(poly[j]);
                                tri.add(poly[j + 1]);
                            }
                        } else {
                            for (long j = 0; j < k; j++) {
                                src.skip(p.type, p.label);
                            }
                        }
                    } else {
                        src.skip(p.type, p.label);
                    }
                }
            }
        }
        if (tri.size() == 0) {
            throw header(name, face.line, "the file has no faces; a mesh needs at least one triangle");
        }
        Map<String, double[]> attributes = new LinkedHashMap<>();
        Map<String, Integer> widths = new LinkedHashMap<>();
        for (int a = 0; a < attr.length; a++) {
            attributes.put(layout.names.get(a), attr[a]);
            widths.put(layout.names.get(a), layout.widths.get(a));
        }
        return new TriangleMesh(name, fxyz, dxyz, tri.toArray(), Collections.unmodifiableMap(attributes),
                Collections.unmodifiableMap(widths));
    }

    /** Where each vertex property goes: x y z, or a component of an attribute. */
    private static final class VertexLayout {
        final int[] slot;
        final int[] attribute;
        final int[] component;
        final List<String> names = new ArrayList<>();
        final List<Integer> widths = new ArrayList<>();
        final boolean floatPositions;

        VertexLayout(String file, Element vertex) {
            List<Property> ps = vertex.props;
            int n = ps.size();
            slot = new int[n];
            attribute = new int[n];
            component = new int[n];
            int[] xyz = {-1, -1, -1};
            for (int i = 0; i < n; i++) {
                Property p = ps.get(i);
                int axis = p.name.equals("x") ? 0 : p.name.equals("y") ? 1 : p.name.equals("z") ? 2 : -1;
                if (axis >= 0) {
                    if (p.list) {
                        throw header(file, vertex.line, "vertex property " + p.name + " must be a scalar");
                    }
                    xyz[axis] = i;
                }
            }
            if (xyz[0] < 0 || xyz[1] < 0 || xyz[2] < 0) {
                throw header(file, vertex.line, "the vertex element needs scalar properties x, y and z");
            }
            floatPositions = ps.get(xyz[0]).type == FLOAT32 && ps.get(xyz[1]).type == FLOAT32
                    && ps.get(xyz[2]).type == FLOAT32;
            Set<String> seen = new HashSet<>();
            for (int i = 0; i < n; i++) {
                Property p = ps.get(i);
                slot[i] = -1;
                if (i == xyz[0] || i == xyz[1] || i == xyz[2]) {
                    slot[i] = i == xyz[0] ? 0 : i == xyz[1] ? 1 : 2;
                    continue;
                }
                if (p.list) {
                    continue;
                }
                String nm = p.name;
                int width = 1;
                if (nm.length() > 1 && nm.endsWith("x") && i + 2 < n) {
                    String stem = nm.substring(0, nm.length() - 1);
                    Property py = ps.get(i + 1), pz = ps.get(i + 2);
                    if (!py.list && !pz.list && py.name.equals(stem + "y") && pz.name.equals(stem + "z")) {
                        width = 3;
                        nm = stem.endsWith("_") && stem.length() > 1 ? stem.substring(0, stem.length() - 1) : stem;
                    }
                }
                if (!seen.add(nm)) {
                    throw header(file, vertex.line, "vertex attribute " + quote(nm) + " is defined twice");
                }
                int a = names.size();
                names.add(nm);
                widths.add(width);
                for (int k = 0; k < width; k++) {
                    slot[i + k] = 3;
                    attribute[i + k] = a;
                    component[i + k] = k;
                }
                i += width - 1;
            }
        }
    }

    /** Checks the declared counts against the bytes after the header, before anything is allocated. */
    private static void checkSize(byte[] b, int start, String name, int format, List<Element> elements) {
        long remaining = b.length - start;
        long need = 0;
        for (Element el : elements) {
            long per = 0;
            for (Property p : el.props) {
                per += format == ASCII ? 2 : p.list ? SIZE[p.countType] : SIZE[p.type];
            }
            need = Math.min(Long.MAX_VALUE / 4, need + Math.min(Long.MAX_VALUE / 4, per * el.count));
            if (need > remaining + (format == ASCII ? 1 : 0)) {
                throw header(name, el.line, "the header declares " + el.count + " " + quote(el.name)
                        + " items, which with the elements before need at least " + need + " bytes"
                        + (format == ASCII ? " of text" : "") + ", but only " + remaining
                        + " bytes follow the header");
            }
        }
    }

    /** Values in the body, ASCII or binary. */
    private interface Source {
        double scalar(int type, String what);

        long integer(int type, String what);

        void skip(int type, String what);

        /** @return whether k more values of the given byte size can be present */
        boolean fits(long k, int size);

        InvalidInputException error(String reason);
    }

    private static final class BinarySource implements Source {
        private final byte[] b;
        private final String name;
        private final boolean big;
        private int pos;
        private int at;

        BinarySource(byte[] b, int start, String name, boolean big) {
            this.b = b;
            this.pos = start;
            this.name = name;
            this.big = big;
        }

        private void need(int n, String what) {
            at = pos;
            if (b.length - pos < n) {
                throw error("the file ends inside " + what + " (" + n + " bytes needed, " + (b.length - pos)
                        + " left)");
            }
        }

        private long raw(int size) {
            long v = 0;
            if (big) {
                for (int i = 0; i < size; i++) {
                    v = v << 8 | (b[pos + i] & 0xffL);
                }
            } else {
                for (int i = size - 1; i >= 0; i--) {
                    v = v << 8 | (b[pos + i] & 0xffL);
                }
            }
            pos += size;
            return v;
        }

        private long intValue(int type) {
            long v = raw(SIZE[type]);
            return switch (type) {
                case INT8 -> (byte) v;
                case INT16 -> (short) v;
                case INT32 -> (int) v;
                default -> v; // unsigned types
            };
        }

        @Override
        public double scalar(int type, String what) {
            need(SIZE[type], what);
            if (type == FLOAT32) {
                return Float.intBitsToFloat((int) raw(4));
            }
            if (type == FLOAT64) {
                return Double.longBitsToDouble(raw(8));
            }
            return intValue(type);
        }

        @Override
        public long integer(int type, String what) {
            need(SIZE[type], what);
            return intValue(type);
        }

        @Override
        public void skip(int type, String what) {
            need(SIZE[type], what);
            pos += SIZE[type];
        }

        @Override
        public boolean fits(long k, int size) {
            at = pos;
            return k * size <= b.length - pos;
        }

        @Override
        public InvalidInputException error(String reason) {
            return MeshBytes.error(name, "byte " + at, reason);
        }
    }

    private static final class AsciiSource implements Source {
        private final TextCursor c;
        private final int end;

        AsciiSource(byte[] b, int start, String name, int firstLine) {
            this.c = new TextCursor(b, start, b.length, name, firstLine, false);
            this.end = b.length;
        }

        @Override
        public double scalar(int type, String what) {
            c.requireAnyToken(what);
            if (type == FLOAT32) {
                return (float) c.number(what);
            }
            if (type == FLOAT64) {
                return c.number(what);
            }
            return ranged(type, c.integer(what), what);
        }

        private long ranged(int type, long v, String what) {
            if (v < MIN[type] || v > MAX[type]) {
                throw c.error("value " + v + " of " + what + " is out of range for type " + TYPE_NAMES[type][0]
                        + ": allowed " + MIN[type] + " to " + MAX[type]);
            }
            return v;
        }

        @Override
        public long integer(int type, String what) {
            c.requireAnyToken(what);
            return ranged(type, c.integer(what), what);
        }

        @Override
        public void skip(int type, String what) {
            c.requireAnyToken(what);
            if (type >= FLOAT32) {
                c.number(what);
            } else {
                ranged(type, c.integer(what), what);
            }
        }

        @Override
        public boolean fits(long k, int size) {
            // Each ASCII value takes at least two characters; a count beyond that cannot be honest.
            return k <= ((long) end + 1) / 2;
        }

        @Override
        public InvalidInputException error(String reason) {
            return c.error(reason);
        }
    }
}
