package dev.fray.core.sim;

import dev.fray.core.boundary.Shape;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A solid body: a shape filled with particles of one material. Immutable; build with {@link #named(String)}.
 *
 * <p>Particles sit on a cubic lattice of the given spacing (m) over the shape's bounds, each moved by a random
 * offset of up to {@code jitter * spacing} per axis drawn from the explicit seed, and kept if inside the shape.
 * Each particle gets mass density * spacing^3 and volume spacing^3.
 *
 * @param name            unique name
 * @param shape           region filled with particles (bounded)
 * @param material        constitutive law
 * @param spacing         particle spacing in m; NaN means half the cell size (8 particles per cell)
 * @param jitter          random offset as a fraction of the spacing, in [0, 0.5]
 * @param seed            seed of the jitter
 * @param linearVelocity  initial velocity (3 values, m/s)
 * @param angularVelocity initial angular velocity about the shape's bounds centre (3 values, rad/s)
 * @param velocityField   initial velocity as a function of position, added to the above; may be null
 * @param damage          damage model, or null for a body that never breaks
 * @param initialChannels initial values of channels (declared by the law or damage model) as functions of
 *                        position, applied after sampling in insertion order
 */
public record Body(String name, Shape shape, MaterialLaw material, double spacing, double jitter, long seed,
                   double[] linearVelocity, double[] angularVelocity, VelocityField velocityField,
                   DamageModel damage, Map<String, ChannelField> initialChannels) {
    /** Validates the fields. */
    public Body {
        Checks.notNull("body name", name);
        String f = "body \"" + name + "\" ";
        Checks.notNull(f + "shape", shape);
        Checks.notNull(f + "material", material);
        if (!Double.isNaN(spacing)) {
            Checks.positive(f + "spacing (m)", spacing);
        }
        Checks.inRange(f + "jitter (fraction of spacing)", jitter, 0, false, 0.5, false);
        linearVelocity = vec(f + "velocity (m/s)", linearVelocity);
        angularVelocity = vec(f + "angularVelocity (rad/s)", angularVelocity);
        if (damage != null && !material.supportsSplit(damage.tensionSplit())) {
            throw new dev.fray.core.error.InvalidInputException(dev.fray.core.error.FrayMessage.INCONSISTENT,
                    f + "damage \"" + damage.name() + "\"", "asks for the " + damage.tensionSplit()
                    + " tension-compression split, which material \"" + material.name() + "\" does not offer");
        }
        initialChannels = initialChannels == null ? Map.of()
                : Collections.unmodifiableMap(new LinkedHashMap<>(initialChannels));
    }

    private static double[] vec(String field, double[] v) {
        if (v == null) {
            return new double[3];
        }
        if (v.length != 3) {
            throw new dev.fray.core.error.InvalidInputException(dev.fray.core.error.FrayMessage.OUT_OF_RANGE,
                    field + " length", v.length, "3");
        }
        for (int i = 0; i < 3; i++) {
            Checks.finite(field + "[" + i + "]", v[i]);
        }
        return v.clone();
    }

    /** @return a copy of the initial velocity, m/s */
    @Override
    public double[] linearVelocity() {
        return linearVelocity.clone();
    }

    /** @return a copy of the initial angular velocity, rad/s */
    @Override
    public double[] angularVelocity() {
        return angularVelocity.clone();
    }

    /**
     * @param name the body's name
     * @return a builder
     */
    public static Builder named(String name) {
        return new Builder(name);
    }

    /** Fluent builder for a {@link Body}. */
    public static final class Builder {
        private final String name;
        private Shape shape;
        private MaterialLaw material;
        private double spacing = Double.NaN;
        private double jitter = 0.0;
        private long seed = 1;
        private final double[] v = new double[3];
        private final double[] w = new double[3];
        private VelocityField field;
        private DamageModel damage;
        private final Map<String, ChannelField> channels = new LinkedHashMap<>();

        private Builder(String name) {
            this.name = name;
        }

        /**
         * @param s region to fill
         * @return this
         */
        public Builder shape(Shape s) {
            this.shape = s;
            return this;
        }

        /**
         * @param law constitutive law
         * @return this
         */
        public Builder material(MaterialLaw law) {
            this.material = law;
            return this;
        }

        /**
         * @param metres particle spacing, m (&gt; 0)
         * @return this
         */
        public Builder spacing(double metres) {
            this.spacing = metres;
            return this;
        }

        /**
         * @param fraction random offset per axis as a fraction of the spacing, [0, 0.5]
         * @return this
         */
        public Builder jitter(double fraction) {
            this.jitter = fraction;
            return this;
        }

        /**
         * @param s seed of the jitter
         * @return this
         */
        public Builder seed(long s) {
            this.seed = s;
            return this;
        }

        /**
         * @param x initial velocity x, m/s
         * @param y initial velocity y, m/s
         * @param z initial velocity z, m/s
         * @return this
         */
        public Builder velocity(double x, double y, double z) {
            v[0] = x;
            v[1] = y;
            v[2] = z;
            return this;
        }

        /**
         * @param x initial angular velocity x about the shape's centre, rad/s
         * @param y initial angular velocity y, rad/s
         * @param z initial angular velocity z, rad/s
         * @return this
         */
        public Builder angularVelocity(double x, double y, double z) {
            w[0] = x;
            w[1] = y;
            w[2] = z;
            return this;
        }

        /**
         * @param f initial velocity field, added to the uniform and angular parts
         * @return this
         */
        public Builder velocityField(VelocityField f) {
            this.field = f;
            return this;
        }

        /**
         * @param model damage model, or null for none
         * @return this
         */
        public Builder damage(DamageModel model) {
            this.damage = model;
            return this;
        }

        /**
         * @param channel name of a channel declared by the body's law or damage model
         * @param f       its initial value as a function of position
         * @return this
         */
        public Builder initialChannel(String channel, ChannelField f) {
            channels.put(channel, f);
            return this;
        }

        /** @return the body */
        public Body build() {
            return new Body(name, shape, material, spacing, jitter, seed, v, w, field, damage, channels);
        }
    }
}
