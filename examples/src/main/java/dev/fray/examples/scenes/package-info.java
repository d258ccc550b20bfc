/** Built-in demo scenes of our own ({@link dev.fray.examples.scenes.DemoScenes}), run by {@code fray demo}. */
package dev.fray.examples.scenes;
