package dev.fray.core.sim;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.kernel.Kernel;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Immutable description of everything a simulation needs: domain, grid, bodies, boundaries and run settings.
 * Build with {@link #builder()}; start with {@link Simulation#Simulation(Scene)}. All quantities in SI units.
 */
public final class Scene {
    /** Default Courant number. */
    public static final double DEFAULT_CFL = 0.4;
    /** Default stopping tolerance of the implicit solve, relative residual. */
    public static final double DEFAULT_IMPLICIT_TOLERANCE = 1e-5;
    /** Default Newton iterations per implicit step. */
    public static final int DEFAULT_IMPLICIT_ITERATIONS = 20;
    /** Default frames per second of output. */
    public static final double DEFAULT_FRAME_RATE = 24;
    /** Wall faces in the order used by {@link #walls()}. */
    public static final List<String> WALL_FACES = List.of("xMin", "xMax", "yMin", "yMax", "zMin", "zMax");

    private final Bounds domain;
    private final double cellSize;
    private final double[] gravity;
    private final List<Contact> walls;
    private final List<Body> bodies;
    private final List<Obstacle> obstacles;
    private final List<Grip> grips;
    private final Kernel kernel;
    private final double cfl;
    private final double damping;
    private final double maxTimeStep;
    private final double fixedTimeStep;
    private final double frameRate;
    private final int threads;
    private final double speedLimit;
    private final double phaseFieldTolerance;
    private final int phaseFieldMaxIterations;
    private final double separationThreshold;
    private final double separationFriction;
    private final Integration integration;
    private final double implicitTolerance;
    private final int implicitMaxIterations;

    private Scene(Builder b) {
        domain = b.domain;
        cellSize = b.cellSize;
        gravity = b.gravity.clone();
        walls = List.of(b.walls.clone());
        bodies = List.copyOf(b.bodies);
        obstacles = List.copyOf(b.obstacles);
        grips = List.copyOf(b.grips);
        kernel = b.kernel;
        cfl = b.cfl;
        damping = b.damping;
        maxTimeStep = b.maxTimeStep;
        fixedTimeStep = b.fixedTimeStep;
        frameRate = b.frameRate;
        threads = b.threads;
        speedLimit = b.speedLimit;
        phaseFieldTolerance = b.phaseFieldTolerance;
        phaseFieldMaxIterations = b.phaseFieldMaxIterations;
        separationThreshold = b.separationThreshold;
        separationFriction = b.separationFriction;
        integration = b.integration;
        implicitTolerance = b.implicitTolerance;
        implicitMaxIterations = b.implicitMaxIterations;
    }

    /** @return a new builder with the defaults */
    public static Builder builder() {
        return new Builder();
    }

    /** @return the simulation domain, m */
    public Bounds domain() {
        return domain;
    }

    /** @return grid cell size dx, m */
    public double cellSize() {
        return cellSize;
    }

    /** @return gravity, 3 values, m/s^2 (copy) */
    public double[] gravity() {
        return gravity.clone();
    }

    /** @return contact law of each domain face, in {@link #WALL_FACES} order */
    public List<Contact> walls() {
        return walls;
    }

    /** @return the bodies */
    public List<Body> bodies() {
        return bodies;
    }

    /** @return the obstacles */
    public List<Obstacle> obstacles() {
        return obstacles;
    }

    /** @return the grips */
    public List<Grip> grips() {
        return grips;
    }

    /** @return the interpolation kernel */
    public Kernel kernel() {
        return kernel;
    }

    /** @return Courant number of the adaptive time step */
    public double cfl() {
        return cfl;
    }

    /** @return how the scene integrates in time (explicit, implicit, or auto) */
    public Integration integration() {
        return integration;
    }

    /**
     * @return stopping tolerance of the implicit solve: the Newton residual must fall to this fraction of its value
     *         at the step's start (see {@link dev.fray.core.step.ImplicitStep})
     */
    public double implicitTolerance() {
        return implicitTolerance;
    }

    /** @return Newton iterations per implicit step before the step is halved */
    public int implicitMaxIterations() {
        return implicitMaxIterations;
    }

    /** @return velocity damping rate, 1/s (grid velocities decay as exp(-rate t)) */
    public double damping() {
        return damping;
    }

    /** @return largest time step allowed, s */
    public double maxTimeStep() {
        return maxTimeStep;
    }

    /** @return fixed time step in s, or NaN for the adaptive step */
    public double fixedTimeStep() {
        return fixedTimeStep;
    }

    /** @return frames per second of frame events, 1/s */
    public double frameRate() {
        return frameRate;
    }

    /** @return worker threads (results do not depend on it) */
    public int threads() {
        return threads;
    }

    /** @return particle speed above which the run stops as diverged, m/s; NaN means automatic */
    public double speedLimit() {
        return speedLimit;
    }

    /** @return relative residual at which the phase-field conjugate-gradient solve stops */
    public double phaseFieldTolerance() {
        return phaseFieldTolerance;
    }

    /** @return iteration cap of the phase-field solve per step */
    public int phaseFieldMaxIterations() {
        return phaseFieldMaxIterations;
    }

    /** @return whether grid nodes near cracks carry two velocity fields ({@link Builder#separation}) */
    public boolean separates() {
        return !Double.isNaN(separationThreshold);
    }

    /**
     * @return damage (dimensionless, in (0, 1]) a particle must reach before the grid nodes it touches carry two
     *         velocity fields; NaN when separation is off
     */
    public double separationThreshold() {
        return separationThreshold;
    }

    /** @return Coulomb friction coefficient (dimensionless) between the two fields at a node; 0 when off */
    public double separationFriction() {
        return separationFriction;
    }

    /** @return a builder holding this scene's settings, to derive a variant */
    public Builder toBuilder() {
        Builder b = new Builder();
        b.domain = domain;
        b.cellSize = cellSize;
        b.gravity = gravity.clone();
        b.walls = walls.toArray(new Contact[0]);
        b.bodies.addAll(bodies);
        b.obstacles.addAll(obstacles);
        b.grips.addAll(grips);
        b.kernel = kernel;
        b.cfl = cfl;
        b.damping = damping;
        b.maxTimeStep = maxTimeStep;
        b.fixedTimeStep = fixedTimeStep;
        b.frameRate = frameRate;
        b.threads = threads;
        b.speedLimit = speedLimit;
        b.phaseFieldTolerance = phaseFieldTolerance;
        b.phaseFieldMaxIterations = phaseFieldMaxIterations;
        b.separationThreshold = separationThreshold;
        b.separationFriction = separationFriction;
        b.integration = integration;
        b.implicitTolerance = implicitTolerance;
        b.implicitMaxIterations = implicitMaxIterations;
        return b;
    }

    /** Fluent builder; {@link #build()} validates everything and reports the field and allowed range. */
    public static final class Builder {
        private Bounds domain = new Bounds(0, 0, 0, 1, 1, 1);
        private double cellSize = 1.0 / 32;
        private double[] gravity = {0, -9.81, 0};
        private Contact[] walls = {Contact.slip(0), Contact.slip(0), Contact.slip(0), Contact.slip(0),
            Contact.slip(0), Contact.slip(0)};
        private final List<Body> bodies = new ArrayList<>();
        private final List<Obstacle> obstacles = new ArrayList<>();
        private final List<Grip> grips = new ArrayList<>();
        private Kernel kernel = Kernel.QUADRATIC;
        private double cfl = DEFAULT_CFL;
        private double damping = 0;
        private double maxTimeStep = Double.POSITIVE_INFINITY;
        private double fixedTimeStep = Double.NaN;
        private double frameRate = DEFAULT_FRAME_RATE;
        private int threads = Runtime.getRuntime().availableProcessors();
        private double speedLimit = Double.NaN;
        private double phaseFieldTolerance = 1e-6;
        private int phaseFieldMaxIterations = 200;
        private double separationThreshold = Double.NaN;
        private double separationFriction = 0;
        private Integration integration = Integration.EXPLICIT;
        private double implicitTolerance = DEFAULT_IMPLICIT_TOLERANCE;
        private int implicitMaxIterations = DEFAULT_IMPLICIT_ITERATIONS;

        private Builder() {
        }

        /**
         * @param minX domain min x, m
         * @param minY domain min y, m
         * @param minZ domain min z, m
         * @param maxX domain max x, m
         * @param maxY domain max y, m
         * @param maxZ domain max z, m
         * @return this
         */
        public Builder domain(double minX, double minY, double minZ, double maxX, double maxY, double maxZ) {
            this.domain = new Bounds(minX, minY, minZ, maxX, maxY, maxZ);
            return this;
        }

        /**
         * @param dx grid cell size, m
         * @return this
         */
        public Builder cellSize(double dx) {
            this.cellSize = dx;
            return this;
        }

        /**
         * @param gx gravity x, m/s^2
         * @param gy gravity y, m/s^2
         * @param gz gravity z, m/s^2
         * @return this
         */
        public Builder gravity(double gx, double gy, double gz) {
            this.gravity = new double[] {gx, gy, gz};
            return this;
        }

        /**
         * @param all contact law of all six domain faces
         * @return this
         */
        public Builder walls(Contact all) {
            Arrays.fill(walls, all);
            return this;
        }

        /**
         * @param face one of {@link #WALL_FACES}
         * @param c    contact law of that face
         * @return this
         */
        public Builder wall(String face, Contact c) {
            int i = WALL_FACES.indexOf(face);
            if (i < 0) {
                throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "wall face", face, WALL_FACES);
            }
            walls[i] = c;
            return this;
        }

        /**
         * @param b a body
         * @return this
         */
        public Builder add(Body b) {
            bodies.add(b);
            return this;
        }

        /**
         * @param o an obstacle
         * @return this
         */
        public Builder add(Obstacle o) {
            obstacles.add(o);
            return this;
        }

        /**
         * @param g a grip
         * @return this
         */
        public Builder add(Grip g) {
            grips.add(g);
            return this;
        }

        /**
         * @param k interpolation kernel
         * @return this
         */
        public Builder kernel(Kernel k) {
            this.kernel = k;
            return this;
        }

        /**
         * @param courant Courant number of the adaptive step, (0, 1]
         * @return this
         */
        public Builder cfl(double courant) {
            this.cfl = courant;
            return this;
        }

        /**
         * @param rate velocity damping rate, 1/s, &gt;= 0 (for bringing a scene to rest)
         * @return this
         */
        public Builder damping(double rate) {
            this.damping = rate;
            return this;
        }

        /**
         * @param seconds largest time step, s
         * @return this
         */
        public Builder maxTimeStep(double seconds) {
            this.maxTimeStep = seconds;
            return this;
        }

        /**
         * @param seconds fixed time step, s (frames still land exactly: the last step before a frame shortens)
         * @return this
         */
        public Builder fixedTimeStep(double seconds) {
            this.fixedTimeStep = seconds;
            return this;
        }

        /**
         * @param fps frames per second of frame events
         * @return this
         */
        public Builder frameRate(double fps) {
            this.frameRate = fps;
            return this;
        }

        /**
         * @param n worker threads, 1 to 1024
         * @return this
         */
        public Builder threads(int n) {
            this.threads = n;
            return this;
        }

        /**
         * @param metresPerSecond particle speed beyond which the run stops as diverged
         * @return this
         */
        public Builder speedLimit(double metresPerSecond) {
            this.speedLimit = metresPerSecond;
            return this;
        }

        /**
         * Settings of the phase-field solve (conjugate gradients, warm-started each step). It stops when the residual
         * is below the tolerance relative to the larger of the right-hand side and the first residual, or when the
         * largest Jacobi correction of the damage field is below the same number in damage units (damage runs
         * from 0 to 1), whichever comes first, or at the iteration cap.
         *
         * @param relativeTolerance tolerance, (0, 1); default 1e-6
         * @param maxIterations     iteration cap per step, 1 to 100000; default 200
         * @return this
         */
        public Builder phaseFieldSolver(double relativeTolerance, int maxIterations) {
            this.phaseFieldTolerance = relativeTolerance;
            this.phaseFieldMaxIterations = maxIterations;
            return this;
        }

        /**
         * Lets broken pieces part: grid nodes near a crack carry two velocity fields, one for the material on
         * each side, in frictional contact (damage-field-gradient partitioning, Homel and Herbold, IJNME 109,
         * 2017, with the multi-field contact of Bardenhagen et al., CMAME 187, 2000). Off by default, when every
         * node carries one field and the two faces of a crack stay numerically joined until they are about two
         * cells apart. Costs three extra particle passes per step and 15 doubles per grid node when on.
         *
         * @param damageThreshold damage, dimensionless in (0, 1]: a node carries two fields when some particle
         *                        in its reach has at least this damage
         * @param friction        Coulomb friction coefficient between the two fields, dimensionless, &gt;= 0
         * @return this
         */
        public Builder separation(double damageThreshold, double friction) {
            this.separationThreshold = damageThreshold;
            this.separationFriction = friction;
            return this;
        }

        /**
         * How the scene integrates in time: {@link Integration#EXPLICIT} (the default), {@link Integration#IMPLICIT}
         * (backward Euler, steps limited by motion rather than by the elastic wave), or {@link Integration#AUTO}.
         *
         * @param mode the integration
         * @return this
         */
        public Builder integration(Integration mode) {
            this.integration = mode;
            return this;
        }

        /**
         * Settings of the implicit solve.
         *
         * @param tolerance     stop when the Newton residual has fallen to this fraction of its value at the
         *                      step's start (see {@link dev.fray.core.step.ImplicitStep}), (0, 1]; default
         *                      {@value #DEFAULT_IMPLICIT_TOLERANCE}
         * @param maxIterations Newton iterations before a step is halved, 1 to 1000; default
         *                      {@value #DEFAULT_IMPLICIT_ITERATIONS}
         * @return this
         */
        public Builder implicitSolver(double tolerance, int maxIterations) {
            this.implicitTolerance = tolerance;
            this.implicitMaxIterations = maxIterations;
            return this;
        }

        /**
         * Turns off {@link #separation}: every node carries one velocity field (the default).
         *
         * @return this
         */
        public Builder noSeparation() {
            this.separationThreshold = Double.NaN;
            this.separationFriction = 0;
            return this;
        }

        /** Refuses, at build time, what the implicit integrator does not handle, saying what to use instead. */
        private void checkImplicit() {
            if (!Double.isNaN(separationThreshold)) {
                throw new InvalidInputException(FrayMessage.IMPLICIT_UNSUPPORTED, "run.separation",
                        "two velocity fields per node are not in the implicit solve yet",
                        "turn separation off or use run.integration = explicit");
            }
            for (Body b : bodies) {
                if (!b.material().hasStressDifferential()) {
                    throw new InvalidInputException(FrayMessage.IMPLICIT_UNSUPPORTED, "body \"" + b.name()
                            + "\" (material " + b.material().name() + ")",
                            "the material law does not provide its stress differential (plastic laws do not yet)",
                            "use run.integration = explicit or auto, which falls back to explicit");
                }
            }
        }

        /**
         * Validates and freezes the scene.
         *
         * @return the scene
         * @throws InvalidInputException naming the first bad field and its allowed range
         */
        public Scene build() {
            Checks.notNull("domain", domain);
            if (!domain.isFinite()) {
                throw new InvalidInputException(FrayMessage.NOT_FINITE, "domain (m)", domain);
            }
            double dx = Checks.positive("cellSize (m)", cellSize);
            double minEdge = Math.min(domain.maxX() - domain.minX(),
                    Math.min(domain.maxY() - domain.minY(), domain.maxZ() - domain.minZ()));
            if (!(minEdge >= 2 * dx)) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "domain edge (m)", minEdge,
                        ">= 2 cellSize = " + 2 * dx);
            }
            double maxEdge = Math.max(domain.maxX() - domain.minX(),
                    Math.max(domain.maxY() - domain.minY(), domain.maxZ() - domain.minZ()));
            Checks.inRange("domain edge / cellSize", maxEdge / dx, 0, false, 2e6, false);
            for (int i = 0; i < 3; i++) {
                Checks.finite("gravity[" + i + "] (m/s^2)", gravity[i]);
            }
            for (int i = 0; i < 6; i++) {
                Checks.notNull("wall " + WALL_FACES.get(i), walls[i]);
            }
            Checks.notNull("kernel", kernel);
            Checks.inRange("cfl", cfl, 0, true, 1, false);
            Checks.nonNegative("damping (1/s)", damping);
            if (!(maxTimeStep > 0)) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "maxTimeStep (s)", maxTimeStep, "> 0");
            }
            if (!Double.isNaN(fixedTimeStep)) {
                Checks.positive("fixedTimeStep (s)", fixedTimeStep);
            }
            Checks.positive("frameRate (1/s)", frameRate);
            Checks.inRange("threads", threads, 1, 1024);
            if (!Double.isNaN(speedLimit)) {
                Checks.positive("speedLimit (m/s)", speedLimit);
            }
            Checks.inRange("phaseFieldTolerance", phaseFieldTolerance, 0, true, 1, true);
            Checks.inRange("phaseFieldMaxIterations", phaseFieldMaxIterations, 1, 100000);
            if (!Double.isNaN(separationThreshold) || separationFriction != 0) {
                Checks.inRange("separation damageThreshold", separationThreshold, 0, true, 1, false);
                Checks.inRange("separation friction", separationFriction, 0, false, Double.MAX_VALUE, false);
            }
            Checks.notNull("integration", integration);
            Checks.inRange("implicit tolerance", implicitTolerance, 0, true, 1, true);
            Checks.inRange("implicit max iterations", implicitMaxIterations, 1, 1000);
            if (integration == Integration.IMPLICIT) {
                checkImplicit();
            }
            Set<String> names = new HashSet<>();
            for (Body b : bodies) {
                if (!names.add(b.name())) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "body \"" + b.name() + "\"",
                            "two bodies share this name; names must be unique");
                }
                Bounds bb = b.shape().bounds();
                if (!bb.isFinite() || !bb.within(domain)) {
                    throw new InvalidInputException(FrayMessage.BODY_OUTSIDE_DOMAIN, b.name(), bb, domain);
                }
            }
            Set<String> obstacleNames = new HashSet<>();
            for (Obstacle o : obstacles) {
                if (!obstacleNames.add(o.name())) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "obstacle \"" + o.name() + "\"",
                            "two obstacles share this name; names must be unique");
                }
            }
            for (Grip g : grips) {
                if (!names.contains(g.body())) {
                    throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "body of grip \"" + g.name() + "\"",
                            g.body(), names);
                }
            }
            return new Scene(this);
        }
    }
}
