package dev.fray.examples.scenes;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.damage.Fracture;
import dev.fray.damage.Plastic;
import dev.fray.io.scene.RegionField;

/**
 * The demos with plastic laws (see {@link DemoScenes} for the list): sand that flows, a soft metal strip that necks
 * and tears, and wet clay cut by a wire. Same grid and box as the other demos, each tuned to run its default
 * {@link DemoScenes#DEFAULT_FRAMES} frames in well under a minute. Material values are plausible values for
 * pictures (softened so that waves are slow and steps long), not material data. All values in SI units.
 */
final class PlasticDemos {
    /** Grid cell size, m: that of every demo. */
    static final double CELL = DemoScenes.CELL_SIZE;

    /** Friction angle of the sand, degrees (dry sand: about 30 to 35, value from memory). */
    static final double SAND_FRICTION_ANGLE = 30;
    /** Yield stress of the soft metal strip, Pa. */
    static final double STRIP_YIELD = 2e3;
    /** Speed of each grip of the metal strip, m/s. */
    static final double STRIP_PULL = 0.05;
    /** Speed of the wire that cuts the clay, m/s. */
    static final double WIRE_SPEED = 0.3;

    private PlasticDemos() {
    }

    /**
     * A square column of dry sand, 0.2 m wide and 0.32 m tall, collapses on a table and spreads into a low heap.
     * Drucker-Prager (E = 5e4 Pa, nu = 0.3, rho = 1600 kg/m^3, friction angle {@value #SAND_FRICTION_ANGLE}
     * degrees, no cohesion); the table is a floor with Coulomb friction 0.4; no other walls.
     *
     * @param seconds simulated time the default frames cover, s
     * @return the scene builder
     */
    static Scene.Builder sandCollapse(double seconds) {
        Body sand = Body.named("sand")
                .shape(Shapes.box(0.4, 0, 0.4, 0.6, 0.32, 0.6))
                .material(Plastic.druckerPrager(5e4, 0.3, 1600, SAND_FRICTION_ANGLE, 0))
                .jitter(0.25)
                .seed(31)
                .build();
        return base(seconds)
                .walls(Contact.open())
                .wall("yMin", Contact.separating(0.4))
                .add(sand);
    }

    /**
     * A soft metal strip lying on a table, notched in the middle of its front edge, is pulled apart by grips on its
     * ends at {@value #STRIP_PULL} m/s each: the narrowed section at the notch yields first, necks, hardens, and
     * tears across from the notch. Von Mises plasticity (E = 1e5 Pa, nu = 0.33, rho = 2700 kg/m^3, yield stress
     * {@value #STRIP_YIELD} Pa, hardening modulus 1e4 Pa). The middle part carries Rankine damage whose critical
     * stress is 1.25 times the yield stress, so damage starts only after the metal has hardened by plastic flow,
     * with a short softening (softening stress a fifth of the yield stress) so that a damaged particle lets go;
     * the gripped ends are the same metal without damage (three bodies, joined through the grid), because a grip
     * clamps the section at its edge and the hydrostatic tension there would break the metal at the grip first.
     * Separation lets the torn halves part.
     *
     * @param seconds simulated time the default frames cover, s
     * @return the scene builder
     */
    static Scene.Builder stripTear(double seconds) {
        // Lengths along x are whole particle spacings (CELL / 2), so that the three bodies' lattices meet at the
        // spacing of the lattice and the joints are neither thinner nor denser than the rest of the strip.
        double s = CELL / 2;
        double x0 = 12 * s, x1 = 84 * s, end = 20 * s, z0 = 0.38, z1 = 0.62, top = 0.05, mid = 0.5;
        // The notch: a fully broken sheet of particles from the front edge, a third of the way in.
        RegionField notch = RegionField.of(Shapes.box(mid - 0.6 * CELL, -CELL, z0 - CELL, mid + 0.6 * CELL,
                top + CELL, z0 + (z1 - z0) / 3), 1.0);
        Body strip = Body.named("strip")
                .shape(Shapes.box(x0 + end, 0, z0, x1 - end, top, z1))
                .material(metal())
                .damage(Fracture.rankine().criticalStress(1.25 * STRIP_YIELD).softeningStress(0.2 * STRIP_YIELD)
                        .build())
                .jitter(0.25)
                .seed(32)
                .initialChannel(DamageModel.DAMAGE, notch)
                .build();
        double grip = 0.06;
        return base(seconds)
                .wall("yMin", Contact.separating(0.2))
                .separation(0.5, 0.2)
                .add(Body.named("left-end").shape(Shapes.box(x0, 0, z0, x0 + end, top, z1)).material(metal())
                        .jitter(0.25).seed(33).build())
                .add(strip)
                .add(Body.named("right-end").shape(Shapes.box(x1 - end, 0, z0, x1, top, z1)).material(metal())
                        .jitter(0.25).seed(34).build())
                .add(new Grip("left", "left-end", Shapes.box(0, 0, 0, x0 + grip, 1, 1),
                        Motion.linear(-STRIP_PULL, 0, 0)))
                .add(new Grip("right", "right-end", Shapes.box(x1 - grip, 0, 0, 1, 1, 1),
                        Motion.linear(STRIP_PULL, 0, 0)));
    }

    /** The soft metal of {@link #stripTear}. */
    private static MaterialLaw metal() {
        return Plastic.vonMises(1e5, 0.33, 2700, STRIP_YIELD, 1e4);
    }

    /**
     * A block of wet clay on a table is cut by a taut wire, a rod 16 mm across (thinner than a cell), drawn down
     * through it at {@value #WIRE_SPEED} m/s. Non-associated Cam-Clay (E = 5e4 Pa, nu = 0.3, rho = 1800 kg/m^3,
     * friction angle 25 degrees, consolidation pressure 5e3 Pa, tensile ratio 0.3, hardening factor 2): the clay
     * smears and compacts under the wire. Rankine damage with a critical stress of 1800 Pa, just above the tension
     * the clay carries under its own weight, and a short softening (100 Pa) breaks only the clay the wire drags
     * apart; separation lets the two halves part instead of closing up behind the wire, so the block ends in two
     * pieces with a kerf about as wide as the wire.
     *
     * @param seconds simulated time the default frames cover, s
     * @return the scene builder
     */
    static Scene.Builder clayCut(double seconds) {
        Body clay = Body.named("clay")
                .shape(Shapes.box(0.35, 0, 0.4, 0.65, 0.2, 0.6))
                .material(Plastic.camClay(5e4, 0.3, 1800, 25, 5e3, 0.3, 2))
                .damage(Fracture.rankine().criticalStress(1800).softeningStress(100).build())
                .jitter(0.25)
                .seed(33)
                .build();
        Obstacle wire = new Obstacle("wire", Shapes.cylinder(0.5, 0.23, 0.5, 0, 0, 1, 0.008, 0.2),
                Contact.separating(0.1), Motion.linear(0, -WIRE_SPEED, 0));
        return base(seconds)
                .gravity(0, -9.81, 0)
                .wall("yMin", Contact.separating(0.5))
                .separation(0.5, 0.3)
                .add(clay)
                .add(wire);
    }

    private static Scene.Builder base(double seconds) {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(CELL)
                .gravity(0, -9.81, 0)
                .frameRate(DemoScenes.DEFAULT_FRAMES / seconds);
    }
}
