package dev.fray.damage.fracture;

import dev.fray.core.error.Checks;

import java.util.Locale;

/**
 * The crack surface density of a phase-field model, gamma(d) = (1/c_w) (w(d)/l + l |grad d|^2), which sets
 * whether the material has an elastic stage and how wide the damaged band around a crack is. Both are
 * published forms named after Ambrosio and Tortorelli; the closed forms below are those of the homogeneous
 * 1D uniaxial-stress response (energy psi = E eps^2/2, degradation (1 - d)^2) and of the fully developed 1D crack
 * (Pham, Amor, Marigo and Maurini, Int. J. Damage Mech. 20, 2011; Tanne, Li, Bourdin, Marigo and Maurini,
 * J. Mech. Phys. Solids 110, 2018).
 */
public enum CrackDensity {
    /**
     * AT1: w(d) = d, c_w = 8/3, so gamma = 3/8 (d/l + l |grad d|^2). Elastic up to sigma_c = sqrt(3 E Gc / (8 l))
     * (no damage below it, the peak stress is the onset), and a fully developed crack has the compact profile
     * d = (1 - |x|/(2 l))^2 for |x| &lt;= 2 l, zero beyond.
     */
    AT1,
    /**
     * AT2: w(d) = d^2, c_w = 2, so gamma = d^2/(2l) + l/2 |grad d|^2. Damages from the first strain (no elastic
     * stage), peaks at sigma_c = (9/16) sqrt(E Gc / (3 l)) at eps_c = sqrt(Gc / (3 E l)), and a fully developed
     * crack has the profile d = exp(-|x|/l), which never reaches zero.
     */
    AT2;

    /** @return the name used in scene files: "at1" or "at2" */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }

    /**
     * @param key "at1" or "at2", any case
     * @return the density, or null for an unknown key
     */
    public static CrackDensity ofKey(String key) {
        for (CrackDensity c : values()) {
            if (c.key().equalsIgnoreCase(key)) {
                return c;
            }
        }
        return null;
    }

    /**
     * Peak stress of the homogeneous uniaxial response.
     *
     * @param youngsModulus  E, Pa
     * @param fractureEnergy Gc, J/m^2
     * @param lengthScale    l, m
     * @return sigma_c, Pa: AT1 sqrt(3 E Gc / (8 l)), AT2 (9/16) sqrt(E Gc / (3 l))
     */
    public double peakStress(double youngsModulus, double fractureEnergy, double lengthScale) {
        double egl = youngsModulus * fractureEnergy / lengthScale;
        return this == AT1 ? Math.sqrt(3.0 * egl / 8.0) : 9.0 / 16.0 * Math.sqrt(egl / 3.0);
    }

    /**
     * Strain at the peak stress of the homogeneous uniaxial response.
     *
     * @param youngsModulus  E, Pa
     * @param fractureEnergy Gc, J/m^2
     * @param lengthScale    l, m
     * @return eps_c: AT1 sigma_c / E = sqrt(3 Gc / (8 E l)), AT2 sqrt(Gc / (3 E l)) = (16/9) sigma_c / E
     */
    public double peakStrain(double youngsModulus, double fractureEnergy, double lengthScale) {
        double gel = fractureEnergy / (youngsModulus * lengthScale);
        return this == AT1 ? Math.sqrt(3.0 * gel / 8.0) : Math.sqrt(gel / 3.0);
    }

    /**
     * Stress at which damage starts in the homogeneous uniaxial response.
     *
     * @param youngsModulus  E, Pa
     * @param fractureEnergy Gc, J/m^2
     * @param lengthScale    l, m
     * @return AT1: the peak stress; AT2: 0 (damage grows from the first strain)
     */
    public double onsetStress(double youngsModulus, double fractureEnergy, double lengthScale) {
        return this == AT1 ? peakStress(youngsModulus, fractureEnergy, lengthScale) : 0.0;
    }

    /**
     * The fracture energy that gives a chosen peak stress at a length scale: the inverse of
     * {@link #peakStress}.
     *
     * @param strength      sigma_c, Pa, &gt; 0
     * @param youngsModulus E, Pa, &gt; 0
     * @param lengthScale   l, m, &gt; 0
     * @return Gc, J/m^2: AT1 8 l sigma_c^2 / (3 E), AT2 (256/27) l sigma_c^2 / E
     */
    public double fractureEnergyFor(double strength, double youngsModulus, double lengthScale) {
        Checks.positive("strength (Pa)", strength);
        Checks.positive("youngsModulus (Pa)", youngsModulus);
        Checks.positive("lengthScale (m)", lengthScale);
        double s2 = strength * strength * lengthScale / youngsModulus;
        return this == AT1 ? 8.0 * s2 / 3.0 : 256.0 * s2 / 27.0;
    }

    /**
     * Width of the band where lo &lt; d &lt; hi across a fully developed crack (both sides), from the closed-form
     * profiles: the reference for the crack-band width figure of a run.
     *
     * @param lengthScale l, m
     * @param lo          lower damage bound, in (0, hi)
     * @param hi          upper damage bound, in (lo, 1)
     * @return AT1: 4 l (sqrt(hi) - sqrt(lo)); AT2: 2 l ln(hi / lo); m
     */
    public double bandWidth(double lengthScale, double lo, double hi) {
        Checks.inRange("lo", lo, 0, true, hi, true);
        Checks.inRange("hi", hi, lo, true, 1, true);
        return this == AT1 ? 4.0 * lengthScale * (Math.sqrt(hi) - Math.sqrt(lo))
                : 2.0 * lengthScale * Math.log(hi / lo);
    }

    /** @return the formula of {@link #peakStress}, for printed reports */
    public String strengthFormula() {
        return this == AT1 ? "AT1: sigma_c = sqrt(3 E Gc / (8 l))" : "AT2: sigma_c = (9/16) sqrt(E Gc / (3 l))";
    }
}
