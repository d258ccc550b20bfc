/**
 * Triangle meshes in: readers for OBJ, STL (ASCII and binary) and PLY (ASCII and binary) files
 * ({@link dev.fray.io.mesh.Meshes} picks one by extension), the immutable {@link dev.fray.io.mesh.TriangleMesh},
 * the solid a closed mesh encloses as a {@link dev.fray.core.boundary.Shape} for sampling particles and for
 * obstacles ({@link dev.fray.io.mesh.MeshShape}, inside test by the generalised winding number), and a direction
 * field read from a mesh's vertex attribute for fiber channels ({@link dev.fray.io.mesh.MeshDirectionField}).
 *
 * <p>Lengths are in m. Every reader reads the whole file into memory first, checks declared counts against the
 * bytes present before allocating, and reports bad input as an
 * {@link dev.fray.core.error.InvalidInputException} with key {@link dev.fray.core.error.FrayMessage#FILE_ERROR}
 * (file, reason) naming the line or byte offset; it never lets another exception escape on malformed input.
 */
package dev.fray.io.mesh;
