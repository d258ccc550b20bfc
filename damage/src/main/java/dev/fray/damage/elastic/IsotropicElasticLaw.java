package dev.fray.damage.elastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;

/**
 * What the isotropic elastic laws share: their constants (Lame parameters mu and lambda in Pa, density in
 * kg/m^3) and the P-wave speed that sets the time step.
 */
abstract class IsotropicElasticLaw implements MaterialLaw {
    private final ElasticParameters parameters;
    /** Shear modulus mu, Pa. */
    final double mu;
    /** First Lame parameter lambda, Pa. */
    final double lambda;

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    IsotropicElasticLaw(ElasticParameters parameters) {
        this.parameters = Checks.notNull("elastic parameters", parameters);
        this.mu = parameters.mu();
        this.lambda = parameters.lambda();
    }

    /** @return the elastic constants this law was built from */
    public ElasticParameters parameters() {
        return parameters;
    }

    /** {@inheritDoc} */
    @Override
    public double density() {
        return parameters.density();
    }

    /** {@inheritDoc} Here the P-wave speed sqrt((lambda + 2 mu) / rho). */
    @Override
    public double waveSpeed() {
        return parameters.pWaveSpeed();
    }

    /**
     * {@inheritDoc} All four: law default, volumetric-deviatoric, spectral and none (the law's split method says
     * which one its default is).
     */
    @Override
    public boolean supportsSplit(TensionSplit split) {
        return SplitSupport.offersEvery(split);
    }

    /** The interface's split, for the choices a law does not handle itself (reachable from subclasses). */
    final void defaultSplit(TensionSplit split, MaterialState state, int from, int to, double[] tauDegraded,
                            double[] tauKept, double[] psiDegraded, double[] psiKept) {
        MaterialLaw.super.splitKirchhoffStress(split, state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }
}
