package dev.fray.damage.plugin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Plastic;
import dev.fray.damage.plastic.CamClay;
import dev.fray.damage.plastic.DruckerPrager;
import dev.fray.damage.plastic.VonMises;

import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;

/**
 * The plastic laws are found by name, built from scene-file parameters in engineering units, and reject bad values
 * with the field named. Common practice, no source: names, parameter names and error keys are Fray's own
 * conventions (DESIGN.md section 4).
 */
class PlasticLawProvidersTest extends FrayTestBase {
    private static final String WHERE = "scene.json: bodies[0].material";
    private final PluginRegistry registry = PluginRegistry.load();

    private MaterialLaw make(String name, Object... keyValues) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("youngsModulus", 1e6);
        m.put("poissonRatio", 0.3);
        m.put("density", 1500.0);
        for (int i = 0; i < keyValues.length; i += 2) {
            if (keyValues[i + 1] == null) {
                m.remove((String) keyValues[i]);
            } else {
                m.put((String) keyValues[i], keyValues[i + 1]);
            }
        }
        return registry.materialLaw(name, new Parameters(WHERE, m));
    }

    private static InvalidInputException fails(FrayMessage key, Executable e) {
        InvalidInputException ex = assertThrows(InvalidInputException.class, e);
        assertEquals(key, ex.key(), ex.getMessage());
        return ex;
    }

    @Test
    void eachLawIsBuiltByNameLikeItsFactory() {
        VonMises vm = (VonMises) make("von-mises", "yieldStress", 2e4, "hardeningModulus", 1e5);
        assertEquals(2e4, vm.yieldStress());
        assertEquals(1e5, vm.hardeningModulus());
        assertEquals(0.0, ((VonMises) make("von-mises", "yieldStress", 2e4)).hardeningModulus(), "default H");
        DruckerPrager dp = (DruckerPrager) make("drucker-prager", "frictionAngle", 33, "cohesion", 100);
        assertEquals(((DruckerPrager) Plastic.druckerPrager(1e6, 0.3, 1500, 33, 100)).alpha(), dp.alpha());
        assertEquals(0.0, ((DruckerPrager) make("drucker-prager", "frictionAngle", 33)).cohesion(), "default c");
        CamClay cc = (CamClay) make("cam-clay", "frictionAngle", 30, "consolidationPressure", 5e3,
                "hardeningFactor", 2, "tensileRatio", 0.1);
        assertEquals(5e3, cc.consolidationPressureAt(0), 1e-9);
        assertEquals(1500.0, cc.density());
        for (String name : new String[] {"von-mises", "drucker-prager", "cam-clay"}) {
            assertNotNull(registry.materialLaws().get(name), name);
            assertTrue(registry.materialLaws().get(name).description().contains("(Pa)"), name);
        }
        // the wave speed, and so the time step, is that of the elastic part
        assertEquals(Elastic.henckyStVK(1e6, 0.3, 1500).waveSpeed(), vm.waveSpeed(), 0.0);
    }

    @Test
    void badValuesNameTheFieldAndTheUnit() {
        InvalidInputException e = fails(FrayMessage.MISSING, () -> make("von-mises"));
        assertEquals(WHERE + ".yieldStress", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("von-mises", "yieldStress", -1));
        assertEquals(WHERE + ".yieldStress (Pa)", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("von-mises", "yieldStress", 1, "hardeningModulus", -5));
        assertEquals(WHERE + ".hardeningModulus (Pa)", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("drucker-prager", "frictionAngle", 90));
        assertEquals(WHERE + ".frictionAngle (degrees)", e.parts()[0]);
        assertEquals("[0.0, 90.0)", e.parts()[2]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("drucker-prager", "frictionAngle", 30, "cohesion", -1));
        assertEquals(WHERE + ".cohesion (Pa)", e.parts()[0]);
        e = fails(FrayMessage.MISSING, () -> make("cam-clay", "frictionAngle", 30, "hardeningFactor", 2));
        assertEquals(WHERE + ".consolidationPressure", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("cam-clay", "frictionAngle", 30, "consolidationPressure",
                1e4, "hardeningFactor", 2, "tensileRatio", 1.5));
        assertEquals(WHERE + ".tensileRatio", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("cam-clay", "frictionAngle", 30, "consolidationPressure",
                1e4, "hardeningFactor", 0));
        assertEquals(WHERE + ".hardeningFactor", e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> make("drucker-prager", "frictionAngle", 30, "youngsModulus", 0));
        assertEquals(WHERE + ".youngsModulus (Pa)", e.parts()[0]);
        // a misspelt parameter is reported as unknown with a suggestion, before anything missing
        e = fails(FrayMessage.UNKNOWN_NAME, () -> make("von-mises", "yieldStres", 1e4));
        assertTrue(String.valueOf(e.parts()[2]).contains("did you mean \"yieldStress\""), e.getMessage());
        // the factories check the same ranges, without a place
        e = fails(FrayMessage.NOT_FINITE, () -> Plastic.vonMises(1e6, 0.3, 1000, Double.NaN, 0));
        assertEquals(VonMises.YIELD_STRESS_FIELD, e.parts()[0]);
        e = fails(FrayMessage.OUT_OF_RANGE, () -> Plastic.camClay(1e6, 0.3, 1000, 0, 1e4, 0, 1));
        assertEquals(CamClay.FRICTION_ANGLE_FIELD, e.parts()[0]);
        fails(FrayMessage.OUT_OF_RANGE, () -> Plastic.druckerPrager(1e6, 0.6, 1000, 30, 0));
    }

    @Test
    void parametersOfGivesWhatTheProviderReads() {
        MaterialLaw[] laws = {Plastic.vonMises(1e6, 0.3, 1000, 2e4, 0), Plastic.druckerPrager(2e6, 0.25, 1600, 35, 50),
            Plastic.camClay(1e6, 0.3, 1000, 30, 1e4, 0, 2)};
        for (MaterialLaw law : laws) {
            Map<String, Object> p = PlasticLawProviders.parametersOf(law);
            MaterialLaw again = registry.materialLaw(law.name(), new Parameters("test", p));
            assertEquals(law.toString(), again.toString());
        }
        assertEquals(false, PlasticLawProviders.parametersOf(laws[0]).containsKey("hardeningModulus"),
                "defaults left out");
        assertNull(PlasticLawProviders.parametersOf(Elastic.neoHookean(1e6, 0.3, 1000)));
    }
}
