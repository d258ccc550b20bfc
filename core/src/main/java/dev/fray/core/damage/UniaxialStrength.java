package dev.fray.core.damage;

import dev.fray.core.error.Checks;

/**
 * What a damage model's settings mean in uniaxial tension of a material with Young's modulus E: the stress at
 * which damage starts, the peak stress the material carries and the strain at that peak, from the model's
 * homogeneous (gradient-free) response. A quick translation of fracture energies and length scales into the
 * stresses a scene applies; a real body with notches and waves breaks locally earlier than this.
 *
 * @param onsetStress stress at which damage starts, Pa, &gt;= 0 (0 for a model without an elastic stage)
 * @param peakStress  largest stress of the homogeneous response (the strength), Pa, &gt; 0
 * @param peakStrain  strain at the peak stress, dimensionless, &gt; 0
 * @param basis       the formula or rule the figures come from, for humans (e.g. "AT1: sqrt(3 E Gc / (8 l))")
 */
public record UniaxialStrength(double onsetStress, double peakStress, double peakStrain, String basis) {
    /** Validates the figures. */
    public UniaxialStrength {
        Checks.nonNegative("onsetStress (Pa)", onsetStress);
        Checks.positive("peakStress (Pa)", peakStress);
        Checks.positive("peakStrain", peakStrain);
        Checks.notNull("basis", basis);
    }
}
