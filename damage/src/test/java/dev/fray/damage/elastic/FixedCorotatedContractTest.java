package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;
import dev.fray.damage.Elastic;

/** Runs the material-law contract against {@link FixedCorotated} (Stomakhin et al. 2012). */
class FixedCorotatedContractTest extends MaterialLawContract {
    @Override
    protected MaterialLaw createLaw() {
        return Elastic.fixedCorotated(1e6, 0.3, 1000.0);
    }
}
