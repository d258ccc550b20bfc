package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.testing.FrayTestBase;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** The fracture models are found through ServiceLoader and made from named parameters (common practice). */
class FractureProvidersTest extends FrayTestBase {
    private static final String WHERE = "test.json: bodies[0].damage";

    private static DamageModel make(String name, Map<String, ?> values) {
        return PluginRegistry.load().damageModel(name, new Parameters(WHERE, values));
    }

    @Test
    void registryFindsTheModels() {
        Map<String, DamageModelProvider> models = PluginRegistry.load().damageModels();
        for (String name : new String[] {RankineDamage.NAME, PhaseFieldAT2.NAME, PhaseFieldAT1.NAME,
            AnisotropicPhaseField.NAME}) {
            assertTrue(models.containsKey(name), name + " registered; have " + models.keySet());
            assertEquals(name, models.get(name).name());
            assertFalse(models.get(name).description().isEmpty(), "description of " + name);
        }
    }

    @Test
    void providersPassTheParametersOn() {
        PhaseFieldAT2 at2 = assertInstanceOf(PhaseFieldAT2.class, make(PhaseFieldAT2.NAME,
                Map.of("fractureEnergy", 12.0, "lengthScale", 0.02, "viscosity", 3.0, "residualStiffness", 1e-4)));
        assertEquals(12.0, at2.fractureEnergy());
        assertEquals(0.02, at2.lengthScale());
        assertEquals(3.0, at2.viscosity());
        assertEquals(1e-4, at2.residualStiffness());

        AnisotropicPhaseField an = assertInstanceOf(AnisotropicPhaseField.class, make(AnisotropicPhaseField.NAME,
                Map.of("fractureEnergy", 5.0, "fiberStrength1", 4.0, "fiberStrength2", 1.0,
                        "criticalStressAlong", 2e6, "criticalStressAcross", 4e5)));
        assertEquals(2, an.families());
        assertEquals(4.0, an.fiberStrength(1));
        assertEquals(1.0, an.fiberStrength(2));
        assertTrue(an.stressDriven());
        assertEquals(2e6, an.criticalStressAlong());
        assertEquals(4e5, an.criticalStressAcross());
        assertTrue(Double.isNaN(an.lengthScale()), "length scale defaults from the cell size");
        assertEquals(0.02, ((AnisotropicPhaseField) an.resolvedFor(0.01)).lengthScale(), 1e-15);

        PhaseFieldAT1 at1 = assertInstanceOf(PhaseFieldAT1.class, make(PhaseFieldAT1.NAME,
                Map.of("strength", 2e4, "youngsModulus", 2e5, "lengthScale", 0.02)));
        // Gc = 8 l sigma_c^2/(3 E), the inverse of Pham et al. (2011)'s sigma_c = sqrt(3 E Gc/(8 l))
        assertEquals(8 * 0.02 * 4e8 / (3 * 2e5), at1.fractureEnergy(), 1e-12);
        assertEquals(CrackDensity.AT1, at1.crackDensity());
        AnisotropicPhaseField an1 = assertInstanceOf(AnisotropicPhaseField.class, make(AnisotropicPhaseField.NAME,
                Map.of("fractureEnergy", 5.0, "fiberStrength1", 4.0, "crackDensity", "AT1")));
        assertEquals(CrackDensity.AT1, an1.crackDensity());

        RankineDamage r = assertInstanceOf(RankineDamage.class, make(RankineDamage.NAME,
                Map.of("criticalStress", 1e5, "fractureEnergy", 10.0, "youngsModulus", 1e8,
                        "degradation", "quadratic")));
        RankineDamage resolved = (RankineDamage) r.resolvedFor(0.01);
        // s = E Gf/(h sigma_c) - sigma_c/2 with h = one cell (the class comment's formula)
        assertEquals(1e8 * 10 / (0.01 * 1e5) - 0.5e5, resolved.softeningStress(), 1e-6);
        assertEquals(RankineDamage.Degradation.QUADRATIC, resolved.degradationFunction());
    }

    @Test
    void misspeltParameterIsAnUnknownNameWithASuggestion() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> make(PhaseFieldAT2.NAME,
                Map.of("fractureEnergy", 10.0, "lenghtScale", 0.01)));
        assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
        assertEquals("lenghtScale", e.parts()[1]);
        assertTrue(e.parts()[2].toString().contains("did you mean \"lengthScale\""), e.getMessage());

        InvalidInputException r = assertThrows(InvalidInputException.class, () -> make(RankineDamage.NAME,
                Map.of("criticalStres", 1e5, "softeningStress", 1e4)));
        assertEquals(FrayMessage.UNKNOWN_NAME, r.key());
        assertTrue(r.parts()[2].toString().contains("did you mean \"criticalStress\""), r.getMessage());

        InvalidInputException a = assertThrows(InvalidInputException.class, () -> make(AnisotropicPhaseField.NAME,
                Map.of("fractureEnergy", 1.0, "fiberStrenght1", 2.0)));
        assertEquals(FrayMessage.UNKNOWN_NAME, a.key());
        assertTrue(a.parts()[2].toString().contains("did you mean \"fiberStrength1\""), a.getMessage());
    }

    @Test
    void missingAndInconsistentParametersAreNamed() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> make(PhaseFieldAT2.NAME, Map.of("lengthScale", 0.01)));
        assertEquals(FrayMessage.MISSING, e.key());
        assertTrue(e.parts()[0].toString().endsWith("fractureEnergy"), e.getMessage());
        InvalidInputException f = assertThrows(InvalidInputException.class,
                () -> make(AnisotropicPhaseField.NAME, Map.of("fractureEnergy", 1.0, "fiberStrength2", 2.0)));
        assertEquals(FrayMessage.INCONSISTENT, f.key());
        InvalidInputException g = assertThrows(InvalidInputException.class, () -> make(AnisotropicPhaseField.NAME,
                Map.of("fractureEnergy", 1.0, "fiberStrength1", 2.0, "criticalStressAlong", 1e6)));
        assertEquals(FrayMessage.INCONSISTENT, g.key());
        InvalidInputException st = assertThrows(InvalidInputException.class,
                () -> make(PhaseFieldAT1.NAME, Map.of("strength", 1e4)));
        assertEquals(FrayMessage.MISSING, st.key());
        assertTrue(st.parts()[0].toString().endsWith("youngsModulus"), st.getMessage());
        InvalidInputException both = assertThrows(InvalidInputException.class, () -> make(PhaseFieldAT1.NAME,
                Map.of("strength", 1e4, "youngsModulus", 1e6, "fractureEnergy", 3.0)));
        assertEquals(FrayMessage.INCONSISTENT, both.key());
        InvalidInputException cd = assertThrows(InvalidInputException.class, () -> make(AnisotropicPhaseField.NAME,
                Map.of("fractureEnergy", 1.0, "fiberStrength1", 2.0, "crackDensity", "at3")));
        assertEquals(FrayMessage.UNKNOWN_NAME, cd.key());
        assertTrue(cd.parts()[2].toString().contains("did you mean"), cd.getMessage());
        InvalidInputException d = assertThrows(InvalidInputException.class, () -> make(RankineDamage.NAME,
                Map.of("criticalStress", 1e5, "softeningStress", 1e4, "degradation", "cubic")));
        assertEquals(FrayMessage.UNKNOWN_NAME, d.key());
    }
}
