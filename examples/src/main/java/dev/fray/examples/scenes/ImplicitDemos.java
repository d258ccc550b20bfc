package dev.fray.examples.scenes;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;

/**
 * Demos that run with the implicit integrator: stiff parts among soft ones, at steps set by how fast things move
 * rather than by the stiff part's elastic waves. Values in SI units.
 */
final class ImplicitDemos {
    /** Young's modulus of the tile, Pa: stone-like, over a thousand times the rubber's. */
    static final double TILE_E = 1e9;
    /** Strength of the tile (AT1 phase field), Pa. */
    static final double TILE_STRENGTH = 1e6;
    /** Downward speed of the striking ball, m/s. */
    static final double STRIKE_SPEED = 2.0;

    private ImplicitDemos() {
    }

    /**
     * {@code tile-strike}: a stiff brittle tile (E = 1 GPa, nu = 0.22, rho = 2400 kg/m^3; AT1 phase field with a
     * 1 MPa strength) lies across two soft rubber blocks (Neo-Hookean, E = 3e5 Pa, nu = 0.45, rho = 1100 kg/m^3)
     * with a soft gel cube (E = 5e4 Pa) on its end; a ball driven down at 2 m/s strikes its middle and breaks it.
     * The tile's waves (about 700 m/s) would hold an explicit step near 12 microseconds; the implicit step is
     * about 4 milliseconds, a fraction of a cell of the ball's motion.
     *
     * @param seconds simulated time of the default frames, s
     * @return the scene builder
     */
    static Scene.Builder tileStrike(double seconds) {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(DemoScenes.CELL_SIZE)
                .gravity(0, -9.81, 0)
                .frameRate(DemoScenes.DEFAULT_FRAMES / seconds)
                .integration(Integration.IMPLICIT)
                .implicitSolver(1e-2, 20)
                .phaseFieldSolver(1e-3, 100)
                .walls(Contact.separating(0.4))
                .add(Body.named("support-left").shape(Shapes.box(0.2, 0, 0.35, 0.3, 0.2, 0.65))
                        .material(Elastic.neoHookean(3e5, 0.45, 1100)).jitter(0.25).seed(21).build())
                .add(Body.named("support-right").shape(Shapes.box(0.7, 0, 0.35, 0.8, 0.2, 0.65))
                        .material(Elastic.neoHookean(3e5, 0.45, 1100)).jitter(0.25).seed(22).build())
                .add(Body.named("tile").shape(Shapes.box(0.18, 0.2, 0.35, 0.82, 0.26, 0.65))
                        .material(Elastic.fixedCorotated(TILE_E, 0.22, 2400))
                        .damage(Fracture.phaseFieldAT1().strength(TILE_STRENGTH, TILE_E).build())
                        .jitter(0.25).seed(23).build())
                .add(Body.named("gel").shape(Shapes.box(0.66, 0.26, 0.46, 0.74, 0.34, 0.54))
                        .material(Elastic.neoHookean(5e4, 0.4, 1000)).jitter(0.25).seed(24).build())
                .add(new Obstacle("ball", Shapes.sphere(0.5, 0.36, 0.5, 0.08), Contact.separating(0.2),
                        Motion.linear(0, -STRIKE_SPEED, 0)));
    }
}
