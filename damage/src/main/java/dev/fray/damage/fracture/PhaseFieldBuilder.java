package dev.fray.damage.fracture;

import dev.fray.core.material.TensionSplit;

/**
 * The settings every phase-field model's builder shares: fracture energy (or a strength it follows from), length
 * scale, crack-speed viscosity, residual stiffness and the tension-compression split. Values are checked by the
 * model's {@code build()}.
 *
 * @param <B> the concrete builder, returned by every setter for chaining
 */
public abstract class PhaseFieldBuilder<B extends PhaseFieldBuilder<B>> {
    double fractureEnergy = Double.NaN;
    double strength = Double.NaN;
    double strengthModulus = Double.NaN;
    double lengthScale = Double.NaN;
    double viscosity = 0.0;
    double residual = PhaseFieldAT2.DEFAULT_RESIDUAL_STIFFNESS;
    TensionSplit split = TensionSplit.LAW_DEFAULT;

    PhaseFieldBuilder() {
    }

    /** @return this builder as its concrete type */
    abstract B self();

    /**
     * @param split tension-compression split asked of the material law (which the body checks it offers);
     *              default {@link TensionSplit#LAW_DEFAULT}
     * @return this
     */
    public B tensionSplit(TensionSplit split) {
        this.split = split;
        return self();
    }

    /**
     * @param joulesPerSquareMetre fracture energy Gc, J/m^2, &gt; 0 (this or {@link #strength} is required)
     * @return this
     */
    public B fractureEnergy(double joulesPerSquareMetre) {
        this.fractureEnergy = joulesPerSquareMetre;
        return self();
    }

    /**
     * Chooses the fracture energy by the strength it gives: the peak stress of the homogeneous uniaxial response
     * of the model's {@link CrackDensity} (AT1: Gc = 8 l sigma_c^2 / (3 E); AT2: Gc = (256/27) l sigma_c^2 / E),
     * solved at the length scale, which may default from the cell size. Give this or {@link #fractureEnergy},
     * not both.
     *
     * @param pascals       strength sigma_c, Pa, &gt; 0
     * @param youngsModulus Young's modulus E of the body's material, Pa, &gt; 0
     * @return this
     */
    public B strength(double pascals, double youngsModulus) {
        this.strength = pascals;
        this.strengthModulus = youngsModulus;
        return self();
    }

    /**
     * @param metres length scale l, m (across the fibers for the anisotropic model), at least one cell; NaN (the
     *               default) means two cells
     * @return this
     */
    public B lengthScale(double metres) {
        this.lengthScale = metres;
        return self();
    }

    /**
     * @param pascalSeconds crack-speed viscosity eta, Pa s, &gt;= 0; 0 (the default) is rate-independent
     * @return this
     */
    public B viscosity(double pascalSeconds) {
        this.viscosity = pascalSeconds;
        return self();
    }

    /**
     * @param k residual stiffness, dimensionless, in [0, 0.1]; default
     *          {@link PhaseFieldAT2#DEFAULT_RESIDUAL_STIFFNESS}
     * @return this
     */
    public B residualStiffness(double k) {
        this.residual = k;
        return self();
    }
}
