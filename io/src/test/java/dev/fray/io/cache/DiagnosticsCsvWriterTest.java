package dev.fray.io.cache;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.StepAction;
import dev.fray.core.sim.StepListener;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import dev.fray.io.result.CrackBand;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The diagnostics CSV: exact values, row selection, and publication only at the end of a run. */
class DiagnosticsCsvWriterTest extends FrayTestBase {
    @TempDir
    Path dir;

    private static Simulation simulation() {
        Scene scene = Scene.builder()
                .cellSize(1.0 / 16)
                .threads(2)
                .add(Body.named("cube").shape(Shapes.box(0.3, 0.4, 0.3, 0.6, 0.7, 0.6))
                        .material(Elastic.fixedCorotated(1e4, 0.3, 1000)).jitter(0.2)
                        .velocity(0.3, 0, -0.2).angularVelocity(1, 0, 0).build())
                .build();
        return new Simulation(scene);
    }

    /** Collects the diagnostics the writer should have seen, straight from the simulation. */
    private static final class Recorder implements StepListener {
        final List<Diagnostics> seen = new ArrayList<>();

        @Override
        public void init(dev.fray.core.sim.SimulationView view, double endTime) {
            if (seen.isEmpty()) {
                seen.add(view.diagnostics());
            }
        }

        @Override
        public StepAction afterStep(dev.fray.core.sim.StepInfo info) {
            seen.add(info.view().diagnostics());
            return StepAction.CONTINUE;
        }
    }

    private static List<String[]> read(Path file) throws IOException {
        List<String[]> rows = new ArrayList<>();
        for (String line : Files.readAllLines(file, StandardCharsets.US_ASCII)) {
            rows.add(line.split(",", -1));
        }
        return rows;
    }

    @Test
    void everyStepWithFullPrecision() throws IOException {
        try (Simulation sim = simulation()) {
            DiagnosticsCsvWriter w = DiagnosticsCsvWriter.inFolder(dir);
            Recorder r = new Recorder();
            sim.addStepListener(w);
            sim.addStepListener(r);
            sim.run(0.01);
            List<String[]> rows = read(dir.resolve("diagnostics.csv"));
            List<String> header = new ArrayList<>(List.of(Diagnostics.COLUMNS));
            header.addAll(List.of(DiagnosticsCsvWriter.CRACK_COLUMNS));
            assertEquals(header, List.of(rows.get(0)));
            assertEquals(r.seen.size(), rows.size() - 1, "initial state plus one row per step");
            assertEquals(sim.stepCount() + 1, w.rows());
            for (int i = 0; i < r.seen.size(); i++) {
                double[] expected = r.seen.get(i).values();
                String[] got = rows.get(i + 1);
                assertEquals(expected.length + DiagnosticsCsvWriter.CRACK_COLUMNS.length, got.length);
                assertEquals(r.seen.get(i).step(), Long.parseLong(got[0]));
                for (int k = 1; k < expected.length; k++) {
                    assertEquals(Double.doubleToLongBits(expected[k]), Double.doubleToLongBits(
                            Double.parseDouble(got[k])), "row " + i + " column " + Diagnostics.COLUMNS[k]);
                }
            }
        }
    }

    @Test
    void crackColumnsAreFilledOnFrameRows() throws IOException {
        Scene scene = Scene.builder().cellSize(1.0 / 32).threads(2).frameRate(2000).gravity(0, 0, 0)
                .add(Body.named("cut").shape(Shapes.box(0.3, 0.3, 0.3, 0.7, 0.5, 0.5))
                        .material(Elastic.fixedCorotated(1e4, 0.3, 1000))
                        .damage(Fracture.phaseField().fractureEnergy(1).build())
                        .initialChannel(DamageModel.DAMAGE, (x, y, z, out) -> out[0] = Math.exp(-Math.abs(x - 0.5)
                                * 16))
                        .build())
                .build();
        List<double[]> expected = new ArrayList<>();
        try (Simulation sim = new Simulation(scene)) {
            CrackBand band = new CrackBand();
            sim.addStepListener(DiagnosticsCsvWriter.inFolder(dir));
            sim.addFrameListener((frame, time, view, last) -> {
                CrackBand.Measure m = band.measure(view);
                expected.add(new double[] {m.bandVolume(), m.crackArea(), m.width()});
            });
            sim.runFrames(2);
        }
        List<String[]> rows = read(dir.resolve("diagnostics.csv"));
        int frames = 0;
        int c = Diagnostics.COLUMNS.length;
        for (String[] row : rows.subList(1, rows.size())) {
            double t = Double.parseDouble(row[1]);
            if (Math.round(t * 2000) / 2000.0 == t) {
                double[] e = expected.get(frames++);
                for (int k = 0; k < 3; k++) {
                    assertEquals(Double.doubleToLongBits(e[k]), Double.doubleToLongBits(Double.parseDouble(row[c + k])),
                            "frame row at t = " + t + ", " + DiagnosticsCsvWriter.CRACK_COLUMNS[k]);
                }
                assertTrue(e[2] > 0, "a crack with a band at t = " + t);
            } else {
                assertEquals(List.of("", "", ""), List.of(row).subList(c, c + 3), "empty between frames");
            }
        }
        assertEquals(3, frames, "frames 0, 1 and 2");
    }

    @Test
    void everyNthStepPlusTheEndsAndASecondRunContinues() throws IOException {
        try (Simulation sim = simulation()) {
            DiagnosticsCsvWriter w = new DiagnosticsCsvWriter(dir.resolve("d.csv"), 4);
            sim.addStepListener(w);
            sim.run(0.01);
            long firstEnd = sim.stepCount();
            sim.run(0.01);
            List<Long> steps = new ArrayList<>();
            for (String[] row : read(dir.resolve("d.csv")).subList(1, (int) w.rows() + 1)) {
                steps.add(Long.parseLong(row[0]));
            }
            List<Long> expected = new ArrayList<>();
            for (long s = 0; s <= sim.stepCount(); s++) {
                if (s % 4 == 0 || s == firstEnd || s == sim.stepCount()) {
                    expected.add(s);
                }
            }
            assertEquals(expected, steps);
            assertEquals(1, read(dir.resolve("d.csv")).stream().filter(r -> r[0].equals("step")).count());
        }
    }

    @Test
    void fileAppearsOnlyAtFinishEvenAfterAFailure() throws IOException {
        Path target = dir.resolve("diagnostics.csv");
        Files.writeString(target, "earlier run\n");
        try (Simulation sim = simulation()) {
            DiagnosticsCsvWriter w = DiagnosticsCsvWriter.inFolder(dir);
            sim.addStepListener(w);
            List<String> duringRun = new ArrayList<>();
            sim.addStepListener(info -> {
                try {
                    duringRun.add(Files.readString(target));
                    try (Stream<Path> s = Files.list(dir)) {
                        duringRun.add(String.valueOf(s.count()));
                    }
                } catch (IOException e) {
                    throw new IllegalStateException(e);
                }
                if (info.step() == 2) {
                    throw new IllegalStateException("listener failure (simulated)");
                }
                return StepAction.CONTINUE;
            });
            assertThrows(IllegalStateException.class, () -> sim.run(1.0));
            assertEquals(List.of("earlier run\n", "2", "earlier run\n", "2", "earlier run\n", "2"), duringRun,
                    "old file untouched and one temporary file while the run goes on");
            List<String[]> rows = read(target);
            assertEquals("step", rows.get(0)[0]);
            assertEquals(List.of("0", "1", "2", "3"), rows.subList(1, rows.size()).stream().map(r -> r[0]).toList());
            try (Stream<Path> s = Files.list(dir)) {
                assertEquals(List.of("diagnostics.csv"), s.map(p -> p.getFileName().toString()).toList());
            }
        }
    }

    @Test
    void badArgumentsNameTheField() {
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> new DiagnosticsCsvWriter(dir.resolve("x.csv"), 0));
        assertEquals(FrayMessage.OUT_OF_RANGE, e.key());
        assertEquals("everyNSteps", e.parts()[0]);
        assertEquals(FrayMessage.MISSING, assertThrows(InvalidInputException.class,
                () -> new DiagnosticsCsvWriter(null, 1)).key());
        assertFalse(Files.exists(dir.resolve("x.csv")));
        assertTrue(Files.isDirectory(dir));
    }
}
