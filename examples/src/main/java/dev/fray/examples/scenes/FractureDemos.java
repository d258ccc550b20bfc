package dev.fray.examples.scenes;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.Fracture;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fracture.CrackDensity;
import dev.fray.io.scene.RegionField;
import dev.fray.io.scene.SceneDescription;
import dev.fray.io.scene.Wedge;

import java.util.Map;

/**
 * The demos that break things (see {@link DemoScenes} for the list). Each is tuned to run its default
 * {@link DemoScenes#DEFAULT_FRAMES} frames quickly: about 10 000 particles on a 1/48 m grid, moderate wave
 * speeds, and a frame rate that spreads the frames over the interesting part. Every part is one a scene file can
 * hold (the starting cuts are {@link RegionField}s, the wedge a {@link Wedge}, fiber directions come from the
 * {@link SceneDescription}), so {@code SceneWriter} writes each demo as it is. All values in SI units.
 */
final class FractureDemos {
    /** Grid cell size of the fracture demos, m: that of every demo. */
    static final double CELL = DemoScenes.CELL_SIZE;

    /** Young's modulus of the torn slab, Pa. */
    static final double SLAB_E = 5e4;
    /**
     * Fracture energy of the torn slab, J/m^2; the stiffness variants keep it. With AT1 at the two-cell length
     * scale it gives the slab a strength of sqrt(3 E Gc / (8 l)) = 3.7 kPa, three times the stress wave the grips
     * send when they start, so the slab tears from its cut instead of breaking all over.
     */
    static final double SLAB_GC = 30;
    /**
     * Crack-speed viscosity of slab-tear, Pa s; slab-tear-fast uses the library default 0. Viscosity lets the
     * pull run ahead of the crack and widens the damaged band (crack-band width 1.5 times AT1's closed form at
     * this value, 1.8 times at {@link #SLAB_VISCOSITY_SLOW}), so the values stay small.
     */
    static final double SLAB_VISCOSITY = 5;
    /** Crack-speed viscosity of slab-tear-slow, Pa s. */
    static final double SLAB_VISCOSITY_SLOW = 20;
    /** How far the starting cut reaches into the slab, as a fraction of its depth. */
    static final double SLAB_CUT = 0.4;
    /** Speed of each grip of the torn slab, m/s. */
    static final double SLAB_PULL = 0.12;

    /** Fracture energy of the split board, J/m^2. */
    static final double BOARD_GC = 0.5;
    /** Critical stress of the split board across the grain, Pa; along the grain it is ten times this. */
    static final double BOARD_ACROSS = 500;
    /** Speed of the wedge that splits the board, m/s. */
    static final double BOARD_WEDGE_SPEED = 0.5;

    private FractureDemos() {
    }

    /**
     * A soft gel slab lying on a table is torn in two by grips on its left and right ends pulling apart, starting
     * from a cut in the middle of its front edge, two fifths of the way in. Neo-Hookean (E = youngs, nu = 0.4,
     * rho = 1000 kg/m^3) with AT1 phase-field damage (Gc = {@value #SLAB_GC} J/m^2, length scale two cells, the
     * given crack-speed viscosity): elastic until its strength, so the gel away from the tear stays intact. A cut
     * this long starts the tear well below the slab's strength (the stress at its tip grows with the square root
     * of its length, while the phase field blunts it over about 2 l).
     *
     * @param youngs    Young's modulus, Pa
     * @param viscosity crack-speed viscosity, Pa s
     * @param seconds   simulated time the default frames cover, s
     * @return the scene builder
     */
    static Scene.Builder slabTear(double youngs, double viscosity, double seconds) {
        double x0 = 0.2, x1 = 0.8, z0 = 0.32, z1 = 0.68, top = 0.06;
        DamageModel damage = Fracture.phaseFieldAT1().fractureEnergy(SLAB_GC).viscosity(viscosity).build();
        Body slab = Body.named("slab")
                .shape(Shapes.box(x0, 0, z0, x1, top, z1))
                .material(Elastic.neoHookean(youngs, 0.4, 1000))
                .damage(damage)
                .jitter(0.25)
                .seed(21)
                // The starting cut: a fully broken sheet of particles from the front edge.
                .initialChannel(DamageModel.DAMAGE, RegionField.of(Shapes.box(0.5 - 0.6 * CELL, -CELL, z0 - CELL,
                        0.5 + 0.6 * CELL, top + CELL, z0 + SLAB_CUT * (z1 - z0)), 1.0))
                .build();
        double grip = 0.06;
        return base(seconds, 15)
                .gravity(0, -9.81, 0)
                .wall("yMin", Contact.slip(0.2))
                .add(slab)
                .add(new Grip("left", "slab", Shapes.box(0, 0, 0, x0 + grip, 1, 1), Motion.linear(-SLAB_PULL, 0, 0)))
                .add(new Grip("right", "slab", Shapes.box(x1 - grip, 0, 0, 1, 1, 1), Motion.linear(SLAB_PULL, 0, 0)));
    }

    /**
     * A softwood board with a check (a drying crack) in one end, clamped at the other, is split along the grain by
     * a wedge driven into the check; the split runs on along the grain well past the check. Grain along the length
     * (x). Softwood is about 10 GPa along the grain and 0.5 to 1 GPa across, rho = 450 to 550 kg/m^3 (values from
     * memory, as in VALIDATION.md section D). Softened so that waves are slow enough for a quick run: a
     * Neo-Hookean matrix of E = 3e4 Pa (nu = 0.3, rho = 500 kg/m^3) reinforced along the grain by a quadratic
     * fiber term k = 2e4 Pa (E along about 1.1e5 Pa, 3.7 times the matrix; the across-grain modulus is kept higher
     * than the true ratio so that the wedge pries rather than crushes). Damage is the anisotropic phase field
     * (AT1, alpha = 10, Gc = {@value #BOARD_GC} J/m^2) with the stress driving force, {@value #BOARD_ACROSS} Pa
     * across the grain and ten times that along it, as wood is far stronger along its grain. The across strength
     * is about sqrt(E Gc / l) for the two-cell length scale l, so the process zone is about as wide as the phase
     * field's band, and AT1 leaves the wood below the failure surface intact (with AT2 four fifths of the board
     * ended up partly damaged; with AT1 two fifths, in a band as wide as AT1's closed form), so the split stays a
     * crack instead of a damaged zone. The spectral split keeps compression
     * undegraded, so broken wood under the wedge still bears its push and the wedge pries the halves apart
     * instead of sinking into softened material. Separation (damage-gradient partitioning) lets the halves part.
     * Gravity off, so the soft board does not droop.
     *
     * @param seconds     simulated time the default frames cover, s
     * @param description where the fiber direction field is made and described
     * @return the scene builder
     */
    static Scene.Builder boardSplit(double seconds, SceneDescription description) {
        double x0 = 0.1, x1 = 0.85, y0 = 0.35, y1 = 0.65, z0 = 0.46, z1 = 0.54;
        MaterialLaw wood = Fibers.reinforce(Elastic.neoHookean(3e4, 0.3, 500)).quadratic(2e4).build();
        DamageModel split = Fracture.anisotropicPhaseField().crackDensity(CrackDensity.AT1).fractureEnergy(BOARD_GC)
                .fiberStrengths(10).stressDriving(10 * BOARD_ACROSS, BOARD_ACROSS).tensionSplit(TensionSplit.SPECTRAL)
                .build();
        double mid = 0.5 * (y0 + y1);
        Body board = Body.named("board")
                .shape(Shapes.box(x0, y0, z0, x1, y1, z1))
                .material(wood)
                .damage(split)
                .jitter(0.25)
                .seed(22)
                .initialChannel(FiberChannels.reference(1), description.fiberField("uniform",
                        Map.of("direction", new double[] {1, 0, 0})))
                // The end check: a fully broken sheet of particles a third of the way in, on the mid-plane.
                .initialChannel(DamageModel.DAMAGE, RegionField.of(Shapes.box(x1 - 0.25, mid - 0.6 * CELL,
                        z0 - CELL, x1 + CELL, mid + 0.6 * CELL, z1 + CELL), 1.0))
                .build();
        // A 30 degree wedge, edge along z, its edge one cell off the check's mouth, frictionless; deep enough that
        // its back stays clear of the board over the run.
        Obstacle wedge = new Obstacle("wedge", new Wedge(x1 + CELL, mid, Math.toRadians(15), 0.45),
                Contact.separating(0), Motion.linear(-BOARD_WEDGE_SPEED, 0, 0));
        return base(seconds, 5)
                .gravity(0, 0, 0)
                .separation(0.5, 0)
                .add(board)
                .add(wedge)
                .add(new Grip("clamp", "board", Shapes.box(0, 0, 0, x0 + 0.06, 1, 1), Motion.STILL));
    }

    /**
     * @param seconds    simulated time of the default frames, s
     * @param iterations cap of the phase-field iterations per step
     */
    private static Scene.Builder base(double seconds, int iterations) {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(CELL)
                .frameRate(DemoScenes.DEFAULT_FRAMES / seconds)
                // A loose, capped phase-field solve: warm-started every step, it is accurate enough for a picture.
                .phaseFieldSolver(1e-3, iterations);
    }
}
