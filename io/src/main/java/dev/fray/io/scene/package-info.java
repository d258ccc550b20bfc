/**
 * Scene files: JSON in Fray's own versioned schema ({@value dev.fray.io.scene.SceneReader#FORMAT}), documented
 * field by field in {@code docs/scene-format.md}. {@link dev.fray.io.scene.SceneReader} turns a file into a
 * {@link dev.fray.io.scene.LoadedScene} (the core scene, the {@link dev.fray.io.scene.OutputSettings} of a run and
 * the {@link dev.fray.io.scene.SceneDescription} of how its models were made), reporting every problem at once
 * with file, JSON path, line and column ({@link dev.fray.io.scene.SceneFileException}).
 * {@link dev.fray.io.scene.SceneWriter} writes a scene back, so that a scene built in Java can be saved and read
 * again to an equal scene. All quantities are in SI units.
 */
package dev.fray.io.scene;
