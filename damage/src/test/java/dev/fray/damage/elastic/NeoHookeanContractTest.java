package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;
import dev.fray.damage.Elastic;

/** Runs the material-law contract against {@link NeoHookean} (Bonet and Wood). */
class NeoHookeanContractTest extends MaterialLawContract {
    @Override
    protected MaterialLaw createLaw() {
        return Elastic.neoHookean(1e6, 0.3, 1000.0);
    }
}
