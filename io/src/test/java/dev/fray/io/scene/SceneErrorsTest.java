package dev.fray.io.scene;

import dev.fray.core.boundary.VelocitySchedule;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

/** Every problem names the file, the JSON path, the line and column, and what is allowed; all come at once. */
class SceneErrorsTest extends FrayTestBase {
    private static final SceneReader READER = new SceneReader(PluginRegistry.load());

    @TempDir
    Path tmp;

    /** A valid scene, one key per line, so tests can aim at lines. */
    static String valid() {
        return String.join("\n",
                "{",                                                                            // 1
                "  \"format\": \"fray-scene/1\",",                                               // 2
                "  \"domain\": {\"min\": [0, 0, 0], \"max\": [1, 1, 1]},",                       // 3
                "  \"run\": {",                                                                  // 4
                "    \"cellSize\": 0.05,",                                                       // 5
                "    \"frameRate\": 24",                                                         // 6
                "  },",                                                                          // 7
                "  \"bodies\": [",                                                               // 8
                "    {",                                                                         // 9
                "      \"name\": \"cube\",",                                                     // 10
                "      \"shape\": {\"type\": \"box\", \"min\": [0.4, 0.4, 0.4], \"max\": [0.6, 0.6, 0.6]},", // 11
                "      \"material\": {\"law\": \"neo-hookean\", \"youngsModulus\": 1e5, \"poissonRatio\": 0.3, "
                        + "\"density\": 1000},",                                                 // 12
                "      \"jitter\": 0.2",                                                         // 13
                "    }",                                                                         // 14
                "  ],",                                                                          // 15
                "  \"grips\": [{\"name\": \"hold\", \"body\": \"cube\", \"region\": {\"type\": \"halfSpace\", "
                        + "\"point\": [0, 0.45, 0], \"normal\": [0, -1, 0]}}]",                  // 16
                "}", "");
    }

    private Path write(String name, String text) throws IOException {
        Path p = tmp.resolve(name);
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }

    private SceneFileException fails(String name, String text) throws IOException {
        Path p = write(name, text);
        SceneFileException e = assertThrows(SceneFileException.class, () -> READER.read(p));
        assertEquals(FrayMessage.FILE_ERROR, e.key());
        assertEquals(p.toString(), e.file());
        for (SceneProblem pr : e.problems()) {
            assertEquals(p.toString(), pr.file(), "every problem names the file");
            assertTrue(e.getMessage().contains(pr.describe()), "the message lists " + pr);
        }
        assertTrue(e.getMessage().startsWith(p.toString() + ": "), e.getMessage());
        return e;
    }

    private static SceneProblem only(SceneFileException e) {
        assertEquals(1, e.problems().size(), e.getMessage());
        return e.problems().get(0);
    }

    private static void at(SceneProblem p, String path, int line, String... words) {
        assertEquals(path, p.path(), p.toString());
        assertEquals(line, p.line(), p.toString());
        assertTrue(p.column() > 0, p.toString());
        for (String w : words) {
            assertTrue(p.message().contains(w), "\"" + w + "\" in " + p);
        }
    }

    @Test
    void validSceneReads() throws IOException {
        LoadedScene s = READER.read(write("ok.json", valid()));
        assertEquals(1, s.scene().bodies().size());
        assertEquals(0.05, s.scene().cellSize());
        assertEquals(OutputSettings.defaults(), s.output());
    }

    @Test
    void unknownKeyGetsASuggestion() throws IOException {
        SceneProblem p = only(fails("typo.json", valid().replace("\"jitter\"", "\"jiter\"")));
        at(p, "bodies[0].jiter", 13, "unknown key \"jiter\"", "did you mean \"jitter\"?", "allowed:");
    }

    @Test
    void wrongTypeSaysWhatIsExpected() throws IOException {
        SceneProblem p = only(fails("type.json", valid().replace("\"cellSize\": 0.05", "\"cellSize\": \"fine\"")));
        at(p, "run.cellSize", 5, "must be a number", "\"fine\"");
    }

    @Test
    void outOfRangeSaysTheRange() throws IOException {
        SceneProblem p = only(fails("range.json", valid().replace("\"jitter\": 0.2", "\"jitter\": 0.9")));
        at(p, "bodies[0].jitter", 13, "0.9", "[0, 0.5]");
    }

    @Test
    void missingMeshFileIsNamed() throws IOException {
        String text = valid().replace("{\"type\": \"box\", \"min\": [0.4, 0.4, 0.4], \"max\": [0.6, 0.6, 0.6]}",
                "{\"type\": \"mesh\", \"file\": \"meshes/none.obj\"}");
        SceneProblem p = only(fails("mesh.json", text));
        at(p, "bodies[0].shape.file", 11, "no such mesh file", tmp.resolve("meshes/none.obj").toString());
    }

    @Test
    void everyProblemIsReportedAtOnce() throws IOException {
        String text = valid()
                .replace("\"jitter\"", "\"jiter\"")
                .replace("\"cellSize\": 0.05", "\"cellSize\": \"fine\"")
                .replace("\"poissonRatio\": 0.3", "\"poissonRatio\": 0.7")
                .replace("{\"type\": \"box\", \"min\": [0.4, 0.4, 0.4], \"max\": [0.6, 0.6, 0.6]}",
                        "{\"type\": \"mesh\", \"file\": \"none.obj\"}")
                .replace("\"frameRate\": 24", "\"frameRate\": 24, \"damping\": -1");
        SceneFileException e = fails("many.json", text);
        List<String> paths = e.problems().stream().map(SceneProblem::path).toList();
        assertEquals(List.of("run.cellSize", "run.damping", "bodies[0].shape.file",
                "bodies[0].material.poissonRatio", "bodies[0].jiter"), paths, e.getMessage());
        assertTrue(e.getMessage().contains("5 problems"), e.getMessage());
        assertTrue(e.problems().get(3).message().contains("(-1.0, 0.5)"), e.problems().get(3).toString());
        assertEquals(12, e.problems().get(3).line());
    }

    @Test
    void misspeltModelParametersAreUnknownNotMissing() throws IOException {
        String text = valid().replace("\"youngsModulus\"", "\"youngModulus\"").replace("\"density\"", "\"densty\"");
        SceneFileException e = fails("params.json", text);
        assertEquals(2, e.problems().size(), e.getMessage());
        at(e.problems().get(0), "bodies[0].material.youngModulus", 12, "did you mean \"youngsModulus\"");
        at(e.problems().get(1), "bodies[0].material.densty", 12, "did you mean \"density\"");
    }

    @Test
    void unknownModelNamesGetSuggestions() throws IOException {
        SceneProblem p = only(fails("law.json", valid().replace("\"neo-hookean\"", "\"neo-hookian\"")));
        at(p, "bodies[0].material.law", 12, "unknown material law \"neo-hookian\"", "did you mean \"neo-hookean\"");
        String damaged = valid().replace("\"jitter\": 0.2", "\"jitter\": 0.2, \"damage\": {\"model\": \"rankin\"}");
        p = only(fails("damage.json", damaged));
        at(p, "bodies[0].damage.model", 13, "did you mean \"rankine\"");
    }

    @Test
    void damageLengthScaleBelowTheCellIsLocated() throws IOException {
        String text = valid().replace("\"jitter\": 0.2", "\"jitter\": 0.2,\n \"damage\": {\"model\": "
                + "\"phase-field-at2\", \"fractureEnergy\": 5, \"lengthScale\": 0.01}");
        SceneProblem p = only(fails("length.json", text));
        at(p, "bodies[0].damage.lengthScale", 14, "0.01", "cell");
    }

    @Test
    void gripOnAnUnknownBodyGetsASuggestion() throws IOException {
        SceneProblem p = only(fails("grip.json", valid().replace("\"body\": \"cube\"", "\"body\": \"cub\"")));
        at(p, "grips[0].body", 16, "no body is named \"cub\"", "did you mean \"cube\"");
    }

    @Test
    void syntaxErrorsHaveLineAndColumn() throws IOException {
        SceneProblem p = only(fails("syntax.json", valid().replace("\"frameRate\": 24", "\"frameRate\": 24,")));
        assertEquals(7, p.line(), p.toString());
        assertTrue(p.message().startsWith("not valid JSON"), p.toString());
        p = only(fails("nan.json", valid().replace("0.05", "NaN")));
        assertEquals(5, p.line(), p.toString());
        p = only(fails("huge.json", valid().replace("0.05", "1e999")));
        at(p, "run.cellSize", 5, "finite", "1e999");
        p = only(fails("empty.json", ""));
        assertTrue(p.message().contains("empty"), p.toString());
        p = only(fails("list.json", "[1, 2]"));
        assertTrue(p.message().contains("one JSON object"), p.toString());
    }

    @Test
    void duplicateKeysAndUnknownFormatsAreProblems() throws IOException {
        SceneFileException e = fails("dup.json", valid().replace("\"frameRate\": 24", "\"frameRate\": 24, \"cfl\": 0.3,"
                + " \"cfl\": 0.2").replace("fray-scene/1", "fray-scene/9"));
        assertEquals(2, e.problems().size(), e.getMessage());
        at(e.problems().get(0), "format", 2, "fray-scene/9", "fray-scene/1");
        at(e.problems().get(1), "run.cfl", 6, "appears twice");
    }

    @Test
    void bodiesOutsideTheDomainAndDuplicateNamesAreLocated() throws IOException {
        String text = valid().replace("\"max\": [0.6, 0.6, 0.6]", "\"max\": [1.6, 0.6, 0.6]")
                .replace("\"jitter\": 0.2\n    }", "\"jitter\": 0.2\n    },\n    {\"name\": \"cube\", \"shape\": "
                        + "{\"type\": \"sphere\", \"center\": [0.5, 0.5, 0.5], \"radius\": 0.1}, \"material\": "
                        + "{\"law\": \"fixed-corotated\", \"youngsModulus\": 1e5, \"poissonRatio\": 0.3, "
                        + "\"density\": 1000}}");
        SceneFileException e = fails("outside.json", text);
        assertEquals(2, e.problems().size(), e.getMessage());
        at(e.problems().get(0), "bodies[0].shape", 11, "inside the domain");
        at(e.problems().get(1), "bodies[1].name", 15, "already the name of bodies[0]");
    }

    /** docs/scene-format.md, "initial values" and "shapes": a scalar channel, damage in [0, 1], a wedge's ranges. */
    @Test
    void initialValuesAndWedgesAreChecked() throws IOException {
        String region = "{\"type\": \"box\", \"min\": [0.4, 0.4, 0.4], \"max\": [0.5, 0.6, 0.6]}";
        String text = valid().replace("\"jitter\": 0.2", "\"jitter\": 0.2,\n"                        // 13
                + "      \"damage\": {\"model\": \"phase-field-at2\", \"fractureEnergy\": 5},\n"         // 14
                + "      \"initialValues\": [\n"                                                        // 15
                + "        {\"channel\": \"damgae\", \"region\": " + region + ", \"value\": 1},\n"        // 16
                + "        {\"channel\": \"damage\", \"region\": " + region + ", \"value\": 1.5},\n"      // 17
                + "        {\"channel\": \"fiber-1\", \"region\": " + region + ", \"value\": 0},\n"       // 18
                + "        {\"channel\": \"damage\", \"value\": 1, \"regoin\": " + region + "}\n"        // 19
                + "      ]")
                .replace("{\"type\": \"halfSpace\", \"point\": [0, 0.45, 0], \"normal\": [0, -1, 0]}",
                        "{\"type\": \"wedge\", \"edgeX\": 0.5, \"edgeY\": 0.5, \"halfAngle\": 2, \"depth\": 0}")
                .replace("{\"type\": \"box\", \"min\": [0.4, 0.4, 0.4], \"max\": [0.6, 0.6, 0.6]}",
                        "{\"type\": \"wedge\", \"edgeX\": 0.4, \"edgeY\": 0.5, \"halfAngle\": 0.3, \"depth\": 0.2}")
                .replace("\"density\": 1000},", "\"density\": 1000, \"fibers\": [{\"type\": \"quadratic\", "
                        + "\"stiffness\": 1e4}]},");
        SceneFileException e = fails("regions.json", text);
        List<String> paths = e.problems().stream().map(SceneProblem::path).toList();
        assertEquals(List.of("bodies[0].shape.type", "bodies[0].initialValues[0].channel",
                "bodies[0].initialValues[1].value", "bodies[0].initialValues[2].channel",
                "bodies[0].initialValues[3]", "bodies[0].initialValues[3].regoin",
                "grips[0].region.halfAngle", "grips[0].region.depth"), paths, e.getMessage());
        List<SceneProblem> p = e.problems();
        at(p.get(0), "bodies[0].shape.type", 11, "unbounded", "obstacles");
        at(p.get(1), "bodies[0].initialValues[0].channel", 16, "no channel \"damgae\"", "did you mean \"damage\"",
                "history");
        at(p.get(2), "bodies[0].initialValues[1].value", 17, "1.5", "[0, 1]");
        at(p.get(3), "bodies[0].initialValues[2].channel", 18, "\"fiber-1\" has 3 components", "fiberDirections");
        at(p.get(4), "bodies[0].initialValues[3]", 19, "\"region\" is missing");
        at(p.get(5), "bodies[0].initialValues[3].regoin", 19, "did you mean \"region\"");
        at(p.get(6), "grips[0].region.halfAngle", 23, "(0, 1.5707963267948966) rad");
        at(p.get(7), "grips[0].region.depth", 23, "> 0 m");
    }

    /** The valid scene with a motion on its grip (line 16). */
    private static String gripMotion(String motion) {
        return valid().replace("\"normal\": [0, -1, 0]}}]",
                "\"normal\": [0, -1, 0]}, \"motion\": " + motion + "}]");
    }

    private static final String KNOTS = "{\"velocity\": [0, 0.1, 0], \"schedule\": ";

    /**
     * docs/scene-format.md, "motion": knot times at least 0 and strictly increasing, finite factors, a knot or more.
     * Each case: the motion, the path of the problem, words of its message.
     */
    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "[[0, 0], [0.2, 1], [0.1, 1]]} | schedule[2][0] | 0.1 s;strictly increasing;> 0.2 s;knot 1",
        "[[0, 0], [0.2, 1], [0.2, 0]]} | schedule[2][0] | strictly increasing",
        "[[0, 0], [0.2, 1e999]]}       | schedule[1][1] | finite;1e999",
        "[[0, 0], [-1e999, 1]]}        | schedule[1][0] | finite;-1e999",
        "[]}                           | schedule       | at least one knot",
        "[[-0.1, 0], [0.2, 1]]}        | schedule[0][0] | -0.1;>= 0 s",
        "[[0, 0, 1]]}                  | schedule[0]    | [time (s), factor];a list of 3",
        "{\"velocity\": [0, 0.1, 0], \"ramp\": 0}          | ramp | > 0 s",
        "{\"ramp\": 0.1, \"schedule\": [[0, 1]]}          | ramp | either \"ramp\" or \"schedule\""})
    void badSchedulesAreLocated(String motion, String path, String words) throws IOException {
        String m = motion.startsWith("{") ? motion : KNOTS + motion;
        SceneProblem p = only(fails("schedule.json", gripMotion(m)));
        at(p, "grips[0].motion." + path, 16, words.split(";"));
    }

    @Test
    void scheduleProblemsComeTogether() throws IOException {
        // NaN is not JSON: the parser stops at it, with its line.
        SceneProblem p = only(fails("nan.json", gripMotion(KNOTS + "[[0, 0], [0.2, NaN]]}")));
        assertEquals(16, p.line(), p.toString());
        assertTrue(p.message().startsWith("not valid JSON"), p.toString());
        SceneFileException e = fails("two.json", gripMotion(KNOTS + "[[0, \"up\"], [0.2, 1], [0.1, 1e999]]}"));
        assertEquals(List.of("grips[0].motion.schedule[0][1]", "grips[0].motion.schedule[2][0]",
                "grips[0].motion.schedule[2][1]"), e.problems().stream().map(SceneProblem::path).toList(),
                "every bad knot is reported at once");
    }

    @Test
    void schedulesRead() throws IOException {
        LoadedScene s = READER.read(write("ramp.json", gripMotion("{\"velocity\": [0, 0.2, 0], \"ramp\": 0.1}")));
        assertEquals(VelocitySchedule.ramp(0.1), s.scene().grips().get(0).motion().schedule());
        s = READER.read(write("knots.json", gripMotion("{\"velocity\": [0, 0.2, 0], "
                + "\"schedule\": [[0, 0], [0.1, 1], [2, 1], [2.05, 0]]}")));
        VelocitySchedule k = s.scene().grips().get(0).motion().schedule();
        assertEquals(VelocitySchedule.of(new double[] {0, 0.1, 2, 2.05}, new double[] {0, 1, 1, 0}), k);
        s = READER.read(write("none.json", gripMotion("{\"velocity\": [0, 0.2, 0]}")));
        assertSame(VelocitySchedule.constant(), s.scene().grips().get(0).motion().schedule());
    }

    @Test
    void missingSceneFileIsAFileError() {
        Path p = tmp.resolve("absent.json");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> READER.read(p));
        assertEquals(FrayMessage.FILE_ERROR, e.key());
        assertTrue(e.getMessage().contains(p.toString()), e.getMessage());
        if (e instanceof SceneFileException) {
            fail("a missing file is not a scene problem");
        }
    }
}
