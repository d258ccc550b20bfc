package dev.fray.io.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.io.ByteArrayInputStream;
import java.lang.management.ManagementFactory;

/**
 * What every mesh reader promises on any input (common practice for parsers of untrusted files, no source): it
 * returns a valid mesh or throws {@link InvalidInputException} with key FILE_ERROR naming the file; any other
 * exception is a bug. It finishes quickly, and (where measurable) allocates at most about 64 times the file size.
 */
final class ReaderContract {
    /** Longest a reader may take on one of the small test inputs, s (generous: the build machine is shared). */
    static final double TIME_BUDGET_S = 5;
    /** Allowed allocation per input byte. */
    static final long BYTES_PER_INPUT_BYTE = 64;
    /** Allowed allocation besides that: buffers of fixed size, messages, the exception itself. */
    static final long FIXED_ALLOWANCE = 512 * 1024;

    private ReaderContract() {
    }

    /** The three readers, through their stream entry points. */
    enum Format {
        OBJ("fuzz.obj"), STL("fuzz.stl"), PLY("fuzz.ply");

        final String name;

        Format(String name) {
            this.name = name;
        }

        TriangleMesh read(byte[] data) {
            ByteArrayInputStream in = new ByteArrayInputStream(data);
            return switch (this) {
                case OBJ -> ObjReader.read(in, name);
                case STL -> StlReader.read(in, name);
                case PLY -> PlyReader.read(in, name);
            };
        }
    }

    /**
     * Runs a reader on the data and checks the contract; exceptions other than InvalidInputException propagate
     * and fail the caller.
     *
     * @param format         the reader
     * @param data           the file bytes
     * @param checkAllocated whether to check the allocated bytes (needs the HotSpot thread MX bean)
     * @return the mesh, or null if the reader rejected the input
     */
    static TriangleMesh check(Format format, byte[] data, boolean checkAllocated) {
        com.sun.management.ThreadMXBean mx = checkAllocated
                && ManagementFactory.getThreadMXBean() instanceof com.sun.management.ThreadMXBean t
                && t.isThreadAllocatedMemorySupported() ? t : null;
        if (mx != null) {
            // A first, unmeasured run loads and initialises the classes this input's path needs (message
            // formatting, number parsing), which allocate once per JVM, not per file.
            try {
                format.read(data);
            } catch (InvalidInputException e) {
                // checked below
            }
        }
        long thread = Thread.currentThread().getId();
        long before = mx == null ? 0 : mx.getThreadAllocatedBytes(thread);
        long t0 = System.nanoTime();
        TriangleMesh mesh = null;
        try {
            mesh = format.read(data);
        } catch (InvalidInputException e) {
            assertEquals(FrayMessage.FILE_ERROR, e.key(), e.getMessage());
            assertEquals(format.name, e.parts()[0], e.getMessage());
        }
        double seconds = (System.nanoTime() - t0) * 1e-9;
        assertTrue(seconds < TIME_BUDGET_S, format + " reader took " + seconds + " s on " + data.length + " bytes");
        if (mx != null) {
            long allocated = mx.getThreadAllocatedBytes(thread) - before;
            long allowed = BYTES_PER_INPUT_BYTE * data.length + FIXED_ALLOWANCE;
            assertTrue(allocated <= allowed, format + " reader allocated " + allocated + " bytes for a "
                    + data.length + "-byte file (allowed " + allowed + ")");
        }
        if (mesh != null) {
            assertValid(mesh);
        }
        return mesh;
    }

    /** A returned mesh has triangles, in-range indices and finite numbers. */
    static void assertValid(TriangleMesh m) {
        assertTrue(m.triangleCount() > 0);
        for (int t = 0; t < m.triangleCount(); t++) {
            for (int c = 0; c < 3; c++) {
                int v = m.vertex(t, c);
                assertTrue(v >= 0 && v < m.vertexCount());
            }
        }
        for (int v = 0; v < m.vertexCount(); v++) {
            assertTrue(Double.isFinite(m.x(v)) && Double.isFinite(m.y(v)) && Double.isFinite(m.z(v)));
        }
        for (String a : m.attributeNames()) {
            for (double d : m.attributeValues(a)) {
                assertTrue(Double.isFinite(d));
            }
        }
    }
}
