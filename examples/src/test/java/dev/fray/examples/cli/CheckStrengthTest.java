package dev.fray.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * {@code fray check} translates damage settings into strengths and warns when the scene's loads break a body
 * everywhere or never. The strengths printed are the published homogeneous closed forms (AT1: Pham, Amor, Marigo
 * and Maurini, Int. J. Damage Mech. 20, 2011; AT2: Bourdin, Francfort and Marigo 2008); the loads are the
 * estimates of {@link StrengthReport}, here checked by hand: a grip starting at v sends rho c v (acoustic
 * impedance; common practice, no source).
 */
class CheckStrengthTest {
    @TempDir
    Path tmp;

    /** A gel slab (E = 5e4 Pa, nu = 0.4, rho = 1000 kg/m^3) on the floor, with a damage model and two grips. */
    private static String slab(String damage, double pull) {
        return "{\n"
                + "  \"format\": \"fray-scene/1\",\n"
                + "  \"domain\": {\"min\": [0, 0, 0], \"max\": [1, 1, 1]},\n"
                + "  \"gravity\": [0, -9.81, 0],\n"
                + "  \"run\": {\"cellSize\": 0.04, \"frameRate\": 100, \"threads\": 1},\n"
                + "  \"output\": {\"frames\": 10, \"formats\": [\"csv\"]},\n"
                + "  \"bodies\": [{\"name\": \"slab\", \"shape\": {\"type\": \"box\", \"min\": [0.2, 0, 0.3],"
                + " \"max\": [0.8, 0.08, 0.7]},\n"
                + "    \"material\": {\"law\": \"neo-hookean\", \"youngsModulus\": 5e4, \"poissonRatio\": 0.4,"
                + " \"density\": 1000},\n"
                + "    \"damage\": " + damage + "}],\n"
                + "  \"grips\": [\n"
                + "    {\"name\": \"left\", \"body\": \"slab\", \"region\": {\"type\": \"box\", \"min\": [0, 0, 0],"
                + " \"max\": [0.3, 1, 1]}, \"motion\": {\"velocity\": [" + -pull + ", 0, 0]}},\n"
                + "    {\"name\": \"right\", \"body\": \"slab\", \"region\": {\"type\": \"box\", \"min\": [0.7, 0, 0],"
                + " \"max\": [1, 1, 1]}, \"motion\": {\"velocity\": [" + pull + ", 0, 0]}}]\n"
                + "}\n";
    }

    private String check(String scene) throws IOException {
        Path p = tmp.resolve("scene.json");
        Files.writeString(p, scene);
        CommandLine cl = FrayCommand.newCommandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        assertEquals(0, cl.execute("check", p.toString()), err.toString());
        return out.toString();
    }

    @Test
    void printsTheStrengthOfEachSetting() throws IOException {
        // AT1 with Gc = 30 J/m^2 at l = 2 dx = 0.08 m: sqrt(3 * 5e4 * 30 / (8 * 0.08)) = 2652 Pa
        String o = check(slab("{\"model\": \"phase-field-at1\", \"fractureEnergy\": 30}", 0.02));
        assertTrue(o.contains("strength of slab (E = 5.000e+04 Pa): damage from 2652 Pa, peak 2652 Pa"), o);
        assertTrue(o.contains("AT1: sigma_c = sqrt(3 E Gc / (8 l))"), o);
        // AT2: (9/16) sqrt(5e4 * 30 / (3 * 0.08)) = 1406 Pa, damage from the first strain
        String o2 = check(slab("{\"model\": \"phase-field-at2\", \"fractureEnergy\": 30}", 0.02));
        assertTrue(o2.contains("damage from 0.000 Pa, peak 1406 Pa"), o2);
        String o3 = check(slab("{\"model\": \"rankine\", \"criticalStress\": 3000, \"softeningStress\": 1000}", 0.02));
        assertTrue(o3.contains("damage from 3000 Pa, peak 3000 Pa at strain 0.0600"), o3);
    }

    @Test
    void warnsWhenTheLoadsExceedTheStrengthTenfoldInTheFirstFrame() throws IOException {
        // Grips starting at 2 m/s: rho c v = 1000 * 10.35 m/s * 2 m/s = 2.07e4 Pa against a 2e3 Pa strength.
        String o = check(slab("{\"model\": \"phase-field-at1\", \"strength\": 2000, \"youngsModulus\": 5e4}", 2));
        assertTrue(o.contains("grip \"left\" starting at 2.00 m/s (rho c v): about 2.070e+04 Pa at t = 0.00 s"
                + " (10.35 x peak)"), o);
        assertTrue(o.contains("body \"slab\" will likely break everywhere: grip \"left\" starting at 2.00 m/s"), o);
        assertTrue(o.contains("(frame 0), 10.4 times its strength 2.00e+03 Pa"), o);
        assertFalse(o.contains("never break"), o);
    }

    @Test
    void warnsWhenABodyCanNeverBreak() throws IOException {
        // 1 MPa strength; the grips stretch the 0.42 m between the held particles at 0.02 m/s for 0.1 s
        // (E v t / L = 238 Pa) and the weight over the 0.06 m between the top and bottom particles is
        // rho g H = 589 Pa.
        String o = check(slab("{\"model\": \"phase-field-at1\", \"strength\": 1e6, \"youngsModulus\": 5e4}", 0.01));
        assertTrue(o.contains("body \"slab\" will likely never break: the largest stress this scene applies is"
                + " about 589 Pa (own weight over its height (rho g H))"), o);
        assertFalse(o.contains("break everywhere"), o);
    }

    @Test
    void aBodyThatIsDroppedIsHitByItsImpact() throws IOException {
        // The lowest particles drop 0.51 m onto the floor: v = sqrt(2 g h) = 3.16 m/s, rho c v = 3.27e4 Pa.
        String scene = slab("{\"model\": \"phase-field-at1\", \"strength\": 2000, \"youngsModulus\": 5e4}", 0)
                .replace("\"min\": [0.2, 0, 0.3], \"max\": [0.8, 0.08, 0.7]",
                        "\"min\": [0.35, 0.5, 0.3], \"max\": [0.65, 0.58, 0.7]")
                .replace("\"frames\": 10", "\"frames\": 40");
        String o = check(scene);
        assertTrue(o.contains("load: impact at 3.16 m/s after 0.510 m (rho c v): about 3.274e+04 Pa"), o);
        assertTrue(o.contains("will likely break everywhere: impact"), o);
    }
}
