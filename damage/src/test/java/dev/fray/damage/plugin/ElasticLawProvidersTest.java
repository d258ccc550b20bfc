package dev.fray.damage.plugin;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.plugin.MaterialLawProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.elastic.ElasticParameters;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The elastic laws are found through ServiceLoader and built from scene-file parameters. Common practice, no
 * source: names, parameter names and error keys are Fray's own conventions (DESIGN.md section 4).
 */
class ElasticLawProvidersTest extends FrayTestBase {
    private static final String WHERE = "scene.json: bodies[0].material";

    private static Parameters params(Map<String, ?> values) {
        return new Parameters(WHERE, values);
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {"fixed-corotated", "neo-hookean", "stvk-hencky"})
    void registryFindsAndBuildsEachLaw(String name) {
        PluginRegistry registry = PluginRegistry.load();
        MaterialLawProvider p = registry.materialLaws().get(name);
        assertNotNull(p, "provider \"" + name + "\" not found; have " + registry.materialLaws().keySet());
        assertTrue(p.description().contains("youngsModulus"), p.description());
        MaterialLaw law = registry.materialLaw(name,
                params(Map.of("youngsModulus", 2e6, "poissonRatio", 0.25, "density", 1100)));
        assertEquals(name, law.name());
        assertEquals(1100.0, law.density(), 0.0);
        // same constants as the static factory (published: Lame parameters from E and nu, VALIDATION.md A1)
        MaterialLaw direct = Elastic.byName(name, 2e6, 0.25, 1100);
        assertEquals(direct.waveSpeed(), law.waveSpeed(), 0.0);
        assertEquals(new ElasticParameters(2e6, 0.25, 1100).pWaveSpeed(), law.waveSpeed(), 0.0);
    }

    @Test
    void misspeltParameterIsUnknownWithASuggestion() {
        InvalidInputException ex = assertThrows(InvalidInputException.class, () -> PluginRegistry.load()
                .materialLaw("neo-hookean", params(Map.of("youngModulus", 2e6, "poissonRatio", 0.25,
                        "density", 1100))));
        assertEquals(FrayMessage.UNKNOWN_NAME, ex.key());
        assertEquals("youngModulus", ex.parts()[1]);
        String hint = String.valueOf(ex.parts()[2]);
        assertTrue(hint.contains("did you mean \"youngsModulus\""), hint);
    }

    @Test
    void missingAndBadValuesNameTheField() {
        PluginRegistry registry = PluginRegistry.load();
        InvalidInputException missing = assertThrows(InvalidInputException.class, () -> registry
                .materialLaw("fixed-corotated", params(Map.of("poissonRatio", 0.25, "density", 1100))));
        assertEquals(FrayMessage.MISSING, missing.key());
        assertEquals(WHERE + ".youngsModulus", missing.parts()[0]);
        InvalidInputException range = assertThrows(InvalidInputException.class, () -> registry
                .materialLaw("stvk-hencky", params(Map.of("youngsModulus", 2e6, "poissonRatio", 0.5,
                        "density", 1100))));
        assertEquals(FrayMessage.OUT_OF_RANGE, range.key());
        assertEquals(WHERE + ".poissonRatio", range.parts()[0]);
        InvalidInputException negative = assertThrows(InvalidInputException.class, () -> registry
                .materialLaw("neo-hookean", params(Map.of("youngsModulus", -2e6, "poissonRatio", 0.3,
                        "density", 1100))));
        assertEquals(FrayMessage.OUT_OF_RANGE, negative.key());
        assertEquals(WHERE + ".youngsModulus (Pa)", negative.parts()[0]);
    }
}
