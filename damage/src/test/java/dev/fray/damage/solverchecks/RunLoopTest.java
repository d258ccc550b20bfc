package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.RunSummary;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationView;
import dev.fray.core.sim.StepAction;
import dev.fray.core.sim.StepInfo;
import dev.fray.core.sim.StepListener;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The run loop's contract: frame times, listener order, cancellation and the divergence guard. */
class RunLoopTest extends FrayTestBase {
    private static Scene.Builder small() {
        return Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 16).threads(2).frameRate(30)
                .add(Body.named("block").shape(Shapes.box(0.4, 0.4, 0.4, 0.6, 0.6, 0.6))
                        .material(Elastic.neoHookean(1e5, 0.3, 1000)).build());
    }

    @Test
    void framesLandExactlyOnFrameTimesAndFrameZeroIsTheInitialState() {
        // Common practice, no source: frame k is at k / frameRate.
        try (Simulation sim = new Simulation(small().build())) {
            List<double[]> frames = new ArrayList<>();
            sim.addFrameListener((frame, time, view, last) -> frames.add(new double[] {frame, time, last ? 1 : 0}));
            sim.runFrames(3);
            assertEquals(4, frames.size());
            for (int k = 0; k < 4; k++) {
                assertEquals(k, frames.get(k)[0]);
                assertEquals(k / 30.0, frames.get(k)[1], 1e-15, "time of frame " + k);
            }
            assertEquals(1, frames.get(3)[2], "last frame flagged");
            assertEquals(3 / 30.0, sim.time(), 1e-15);
        }
    }

    @Test
    void listenersStopTheRunAndFinishIsAlwaysCalled() {
        try (Simulation sim = new Simulation(small().build())) {
            int[] calls = new int[3];
            sim.addStepListener(new StepListener() {
                @Override
                public void init(SimulationView view, double endTime) {
                    calls[0]++;
                }

                @Override
                public StepAction afterStep(StepInfo info) {
                    calls[1]++;
                    return info.step() == 4 ? StepAction.STOP : StepAction.CONTINUE;
                }

                @Override
                public void finish(SimulationView view) {
                    calls[2]++;
                }
            });
            RunSummary r = sim.run(1.0);
            assertTrue(r.stopped());
            assertEquals(5, r.steps());
            assertEquals(1, calls[0]);
            assertEquals(5, calls[1]);
            assertEquals(1, calls[2]);
            assertTrue(sim.time() < 1.0);
        }
    }

    @Test
    void hostCanRequestAStopFromAListenerOrAnotherThread() {
        try (Simulation sim = new Simulation(small().build())) {
            sim.addStepListener(info -> {
                if (info.step() == 2) {
                    sim.requestStop();
                }
                return StepAction.CONTINUE;
            });
            RunSummary r = sim.run(1.0);
            assertTrue(r.stopped());
            assertEquals(3, r.steps());
        }
    }

    @Test
    void divergenceNamesBodyParticleStepAndTimeAndFinishStillRuns() {
        // A stiff material with a fixed step far above the CFL bound blows up (common practice, no source).
        Scene scene = small().fixedTimeStep(1e-2)
                .add(Body.named("stiff").shape(Shapes.sphere(0.5, 0.2, 0.5, 0.08))
                        .material(Elastic.fixedCorotated(1e9, 0.3, 1000)).velocity(0, 0, 0.5).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            boolean[] finished = {false};
            sim.addStepListener(new StepListener() {
                @Override
                public StepAction afterStep(StepInfo info) {
                    return StepAction.CONTINUE;
                }

                @Override
                public void finish(SimulationView view) {
                    finished[0] = true;
                }
            });
            SimulationDivergedException e = assertThrows(SimulationDivergedException.class, () -> sim.run(1.0));
            assertEquals(FrayMessage.DIVERGED, e.key());
            assertEquals("stiff", e.body());
            assertTrue(e.particleId() >= 0);
            assertTrue(e.step() >= 0);
            assertFalse(e.getMessage().isBlank());
            assertTrue(finished[0], "finish runs after a divergence");
        }
    }
}
