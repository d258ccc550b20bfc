package dev.fray.io.scene;

import dev.fray.core.boundary.Shape;
import dev.fray.core.error.Checks;
import dev.fray.core.error.InvalidInputException;
import dev.fray.io.mesh.MeshShape;
import dev.fray.io.mesh.Meshes;
import dev.fray.io.mesh.TriangleMesh;
import dev.fray.io.scene.Fields.Range;

import java.io.ByteArrayInputStream;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Mesh shapes of scene files: {"type": "mesh", "file": ..., "scale": ..., "offset": [...], "allowOpen": ...}.
 * The file is relative to the scene file's folder; the mesh is scaled about the origin, then moved by the offset.
 * A file embedded in a checkpoint is read from its bytes instead of the disk.
 */
final class MeshSupport {
    static final List<String> KEYS = List.of("type", "file", "scale", "offset", "allowOpen");

    private MeshSupport() {
    }

    /** A mesh shape as a scene reading sees it: file name as written, resolved place, and transform. */
    record Request(String file, double scale, double[] offset, boolean allowOpen) {
        ModelDescription describe() {
            Map<String, Object> p = new LinkedHashMap<>();
            p.put("file", file);
            if (scale != 1) {
                p.put("scale", scale);
            }
            if (offset[0] != 0 || offset[1] != 0 || offset[2] != 0) {
                p.put("offset", offset.clone());
            }
            if (allowOpen) {
                p.put("allowOpen", true);
            }
            return new ModelDescription("mesh", p);
        }

        String key() {
            return file + "|" + scale + "|" + offset[0] + "|" + offset[1] + "|" + offset[2] + "|" + allowOpen;
        }
    }

    /**
     * Reads the mesh shape described by a shape object.
     *
     * @param f        the shape object (type "mesh")
     * @param baseDir  folder relative names resolve against, or null
     * @param embedded files by name as written, read instead of the disk; may be empty
     * @param cache    shapes already made in this reading, by request
     * @param d        where the shape's description and file go
     * @return the shape, or null after recording a problem
     */
    static Shape shape(Fields f, Path baseDir, Map<String, byte[]> embedded, Map<String, MeshShape> cache,
                       SceneDescription d) {
        String file = f.string("file", null, null, "mesh file (OBJ, STL or PLY), relative to the scene file");
        Double scale = f.number("scale", 1.0, Range.positive(""), "uniform scale factor");
        double[] offset = f.vector("offset", new double[3], Range.any("m"), "offset after scaling, m");
        Boolean open = f.bool("allowOpen", false);
        if (file == null || scale == null || offset == null || open == null) {
            return null;
        }
        Request req = new Request(file, scale, offset, open);
        MeshShape cached = cache.get(req.key());
        if (cached != null) {
            return cached;
        }
        TriangleMesh mesh;
        Path resolved = null;
        try {
            byte[] bytes = embedded.get(file);
            if (bytes != null) {
                mesh = Meshes.read(new ByteArrayInputStream(bytes), file);
            } else {
                resolved = resolve(file, baseDir);
                if (resolved == null) {
                    f.error("file", "\"" + file + "\" is relative, but this scene has no folder to resolve it "
                            + "against; use an absolute path");
                    return null;
                }
                if (!Files.isRegularFile(resolved)) {
                    f.error("file", "no such mesh file: " + resolved);
                    return null;
                }
                mesh = Meshes.read(resolved);
            }
        } catch (InvalidPathException e) {
            f.error("file", "\"" + file + "\" is not a valid file name: " + e.getReason());
            return null;
        } catch (InvalidInputException e) {
            f.error("file", e.getMessage());
            return null;
        }
        MeshShape shape;
        try {
            shape = MeshShape.builder(transform(mesh, scale, offset)).allowOpen(open).build();
        } catch (InvalidInputException e) {
            f.error("file", e.getMessage() + (open ? "" : "; set \"allowOpen\": true to accept an imperfect surface"));
            return null;
        }
        d.describe(shape, req.describe());
        d.file(file, resolved);
        cache.put(req.key(), shape);
        return shape;
    }

    /**
     * Makes a mesh shape for a Java host, as a scene file would.
     *
     * @return the shape
     */
    static MeshShape shape(Path file, double scale, double[] offset, boolean allowOpen) {
        Checks.notNull("mesh file", file);
        Checks.positive("mesh scale", scale);
        Checks.notNull("mesh offset (m)", offset);
        TriangleMesh mesh = Meshes.read(file);
        return MeshShape.builder(transform(mesh, scale, offset)).allowOpen(allowOpen).build();
    }

    /** Scales about the origin, then offsets; attributes carry over unchanged. */
    static TriangleMesh transform(TriangleMesh mesh, double scale, double[] offset) {
        if (scale == 1 && offset[0] == 0 && offset[1] == 0 && offset[2] == 0) {
            return mesh;
        }
        double[] p = mesh.positions();
        for (int i = 0; i < p.length; i++) {
            p[i] = p[i] * scale + offset[i % 3];
        }
        TriangleMesh out = TriangleMesh.of(p, mesh.triangles()).withName(mesh.name());
        for (String a : mesh.attributeNames()) {
            out = out.withAttribute(a, mesh.attributeWidth(a), mesh.attributeValues(a));
        }
        return out;
    }

    /** @return the file resolved against baseDir, or null if it is relative and there is no baseDir */
    static Path resolve(String file, Path baseDir) {
        Path p = Path.of(file);
        if (p.isAbsolute()) {
            return p.normalize();
        }
        return baseDir == null ? null : baseDir.resolve(p).toAbsolutePath().normalize();
    }
}
