package dev.fray.io.mesh;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.io.mesh.MeshFixtures.Encoding;
import dev.fray.io.mesh.MeshFixtures.Raw;
import dev.fray.io.mesh.ReaderContract.Format;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Seeded mutations of valid files (truncation, flipped bytes, huge declared counts, NaN coordinates, wrong
 * types, binary garbage): every reader must return a valid mesh or fail with FILE_ERROR, quickly, allocating at
 * most about 64 times the file size ({@link ReaderContract}; common practice for parsers of untrusted input, no
 * source). Reproducible: each seed gives the same mutated file.
 */
class MeshReaderMutationTest extends FrayTestBase {
    private static final int SEEDS = 400;
    private static final Pattern NUMBER = Pattern.compile("-?[0-9]+(\\.[0-9]+)?([eE][-+]?[0-9]+)?");
    private static final Pattern COUNT = Pattern.compile("element (vertex|face) [0-9]+");

    /** A valid file and its reader. */
    private record Base(Format format, byte[] data, boolean text) {
    }

    private static List<Base> bases() {
        Raw cube = MeshFixtures.cube();
        Raw torus = MeshFixtures.torus(0.3, 0.1, 8, 6);
        double[][] dirs = new double[3][cube.vertices()];
        for (int v = 0; v < cube.vertices(); v++) {
            dirs[0][v] = 1;
            dirs[1][v] = 0.5 * v;
        }
        String[] names = {"fx", "fy", "fz"};
        List<Base> b = new ArrayList<>();
        b.add(new Base(Format.OBJ, MeshFixtures.obj(cube), true));
        b.add(new Base(Format.OBJ, MeshFixtures.obj(torus), true));
        b.add(new Base(Format.OBJ, "v 0 0 0\nv 1 0 0\nv 1 1 0\nv 0 1 0\nf -4/1 -3/2/3 -2//1 -1\n"
                .getBytes(StandardCharsets.US_ASCII), true));
        b.add(new Base(Format.STL, MeshFixtures.stlAscii(cube, "cube"), true));
        b.add(new Base(Format.STL, MeshFixtures.stlBinary(cube, "binary"), false));
        b.add(new Base(Format.STL, MeshFixtures.stlBinary(torus, "solid but binary"), false));
        b.add(new Base(Format.PLY, MeshFixtures.ply(cube, Encoding.ASCII, "float", names, dirs), true));
        b.add(new Base(Format.PLY, MeshFixtures.ply(cube, Encoding.LITTLE, "float", names, dirs), false));
        b.add(new Base(Format.PLY, MeshFixtures.ply(cube, Encoding.BIG, "double", names, dirs), false));
        b.add(new Base(Format.PLY, MeshFixtures.ply(torus, Encoding.LITTLE, "double"), false));
        return b;
    }

    static IntStream seeds() {
        return IntStream.range(0, SEEDS);
    }

    @Test
    void unmutatedBasesAreRead() {
        for (Base b : bases()) {
            ReaderContract.assertValid(ReaderContract.check(b.format, b.data, true));
        }
    }

    @Test
    void largeFilesStayWithinTheMemoryBound() {
        // The densest inputs each format allows: short vertex lines and long polygons (many triangles per byte).
        StringBuilder obj = new StringBuilder();
        for (int i = 0; i < 100_000; i++) {
            obj.append("v 0 0 ").append(i % 10).append('\n');
        }
        for (int f = 0; f < 200; f++) {
            obj.append('f');
            for (int k = 0; k < 3000; k++) {
                obj.append(' ').append(1 + (k + f) % 9);
            }
            obj.append('\n');
        }
        ReaderContract.assertValid(ReaderContract.check(Format.OBJ, obj.toString().getBytes(StandardCharsets.US_ASCII),
                true));
        StringBuilder ply = new StringBuilder("ply\nformat ascii 1.0\nelement vertex 9\nproperty uchar x\n"
                + "property uchar y\nproperty uchar z\nproperty uchar q\nelement face 1000\n"
                + "property list ushort uchar vertex_indices\nend_header\n");
        for (int v = 0; v < 9; v++) {
            ply.append(v).append(" 0 ").append(v % 2).append(" 1\n");
        }
        for (int f = 0; f < 1000; f++) {
            ply.append("1000");
            for (int k = 0; k < 1000; k++) {
                ply.append(' ').append((k + f) % 9);
            }
            ply.append('\n');
        }
        ReaderContract.assertValid(ReaderContract.check(Format.PLY, ply.toString().getBytes(StandardCharsets.US_ASCII),
                true));
        Raw torus = MeshFixtures.torus(0.3, 0.1, 200, 100);
        ReaderContract.assertValid(ReaderContract.check(Format.STL, MeshFixtures.stlBinary(torus, "big"), true));
        ReaderContract.assertValid(ReaderContract.check(Format.STL, MeshFixtures.stlAscii(torus, "big"), true));
        ReaderContract.assertValid(ReaderContract.check(Format.PLY,
                MeshFixtures.ply(torus, Encoding.LITTLE, "float"), true));
    }

    @ParameterizedTest
    @MethodSource("seeds")
    void mutatedFilesFailCleanly(int seed) {
        Random r = new Random(seed);
        List<Base> all = bases();
        Base base = all.get(seed % all.size());
        byte[] data = base.data.clone();
        int mutations = 1 + r.nextInt(3);
        for (int m = 0; m < mutations; m++) {
            data = mutate(data, base, r);
        }
        ReaderContract.check(base.format, data, true);
        // The other readers must cope with the same bytes too.
        for (Format f : Format.values()) {
            ReaderContract.check(f, data, true);
        }
    }

    private static byte[] mutate(byte[] d, Base base, Random r) {
        switch (r.nextInt(6)) {
            case 0: // truncate
                return Arrays.copyOf(d, r.nextInt(d.length + 1));
            case 1: { // flip bytes
                byte[] out = d.clone();
                for (int k = 1 + r.nextInt(8); k > 0 && out.length > 0; k--) {
                    out[r.nextInt(out.length)] ^= (byte) (1 + r.nextInt(255));
                }
                return out;
            }
            case 2:
                return hugeCount(d, base, r);
            case 3:
                return nan(d, base, r);
            case 4:
                return wrongType(d, r);
            default: { // binary garbage: a whole file of it, inserted, or appended
                byte[] junk = new byte[r.nextInt(2000)];
                r.nextBytes(junk);
                int how = r.nextInt(3);
                if (how == 0) {
                    return junk;
                }
                int at = how == 1 ? r.nextInt(d.length + 1) : d.length;
                byte[] out = new byte[d.length + junk.length];
                System.arraycopy(d, 0, out, 0, at);
                System.arraycopy(junk, 0, out, at, junk.length);
                System.arraycopy(d, at, out, at + junk.length, d.length - at);
                return out;
            }
        }
    }

    private static final String[] HUGE = {"2147483647", "2147483648", "4294967295", "18446744073709551615",
        "99999999999999999999999", "1000000", "-1", "0", "1e9", "abc"};

    private static byte[] hugeCount(byte[] d, Base base, Random r) {
        String s = new String(d, StandardCharsets.ISO_8859_1);
        Matcher m = COUNT.matcher(s);
        List<int[]> found = new ArrayList<>();
        while (m.find()) {
            found.add(new int[] {m.start(), m.end()});
        }
        if (!found.isEmpty()) {
            int[] f = found.get(r.nextInt(found.size()));
            String head = s.substring(f[0], f[1]).replaceAll("[0-9]+$", "");
            String out = s.substring(0, f[0]) + head + HUGE[r.nextInt(HUGE.length)] + s.substring(f[1]);
            byte[] b = out.getBytes(StandardCharsets.ISO_8859_1);
            if (r.nextBoolean() && !base.text) {
                // Also a huge list count in the first face bytes after the header.
                int h = out.indexOf("end_header\n");
                if (h >= 0 && h + 11 < b.length) {
                    b[h + 11 + r.nextInt(b.length - h - 11)] = (byte) 0xff;
                }
            }
            return b;
        }
        if (base.format == Format.STL && d.length >= 84) {
            byte[] out = d.clone();
            long n = switch (r.nextInt(4)) {
                case 0 -> 0xffffffffL;
                case 1 -> 0x7fffffffL;
                case 2 -> ((d.length - 84) / 50) + 1;
                default -> 0;
            };
            for (int k = 0; k < 4; k++) {
                out[80 + k] = (byte) (n >>> (8 * k));
            }
            return out;
        }
        // OBJ: a face index far out of range.
        return s.replaceFirst("f ([-0-9]+)", "f " + HUGE[r.nextInt(HUGE.length)]).getBytes(StandardCharsets.ISO_8859_1);
    }

    private static final String[] NOT_FINITE = {"nan", "NaN", "-nan", "inf", "-Infinity", "1e999", "-1e400",
        "0x1p3", "1.5e", "--3", "1..2", ""};

    private static byte[] nan(byte[] d, Base base, Random r) {
        if (base.text) {
            String s = new String(d, StandardCharsets.ISO_8859_1);
            Matcher m = NUMBER.matcher(s);
            List<int[]> found = new ArrayList<>();
            while (m.find()) {
                found.add(new int[] {m.start(), m.end()});
            }
            if (found.isEmpty()) {
                return d;
            }
            int[] f = found.get(r.nextInt(found.size()));
            return (s.substring(0, f[0]) + NOT_FINITE[r.nextInt(NOT_FINITE.length)] + s.substring(f[1]))
                    .getBytes(StandardCharsets.ISO_8859_1);
        }
        byte[] out = d.clone();
        int start = base.format == Format.STL ? 84 : headerEnd(d);
        if (start >= out.length - 4) {
            return out;
        }
        int at = start + 4 * r.nextInt((out.length - start) / 4);
        byte[] pattern = r.nextBoolean() ? new byte[] {0, 0, (byte) 0xc0, 0x7f} : new byte[] {(byte) 0xff,
            (byte) 0xff, (byte) 0xff, (byte) 0xff};
        System.arraycopy(pattern, 0, out, at, 4);
        return out;
    }

    private static int headerEnd(byte[] d) {
        String s = new String(d, StandardCharsets.ISO_8859_1);
        int h = s.indexOf("end_header\n");
        return h < 0 ? 0 : h + 11;
    }

    private static final String[][] SWAPS = {{"float", "double"}, {"float", "int"}, {"float", "uchar"},
        {"float", "string"}, {"float", "list uchar int"}, {"double", "float"}, {"uchar int", "float float"},
        {"uchar int", "int uchar"}, {"uchar int", "uint int"}, {"binary_little_endian", "ascii"},
        {"binary_big_endian", "binary_little_endian"}, {"ascii", "binary_big_endian"}, {"vertex_indices", "idx"},
        {"element face", "element edge"}, {"property float x", "property list int int x"}, {"1.0", "2.0"},
        {"f ", "v "}, {"v ", "f "}, {"vertex", "normal"}, {"facet", "solid"}, {"endloop", "endfacet"},
        {"outer loop", "outer"}, {"endsolid", "end"}};

    private static byte[] wrongType(byte[] d, Random r) {
        String s = new String(d, StandardCharsets.ISO_8859_1);
        String[] swap = SWAPS[r.nextInt(SWAPS.length)];
        int at = s.indexOf(swap[0]);
        if (at < 0) {
            return d;
        }
        // Header words live in the first kilobyte; past it only text formats have more of them.
        String out = r.nextBoolean() ? s.substring(0, at) + swap[1] + s.substring(at + swap[0].length())
                : s.replace(swap[0], swap[1]);
        return out.getBytes(StandardCharsets.ISO_8859_1);
    }
}
