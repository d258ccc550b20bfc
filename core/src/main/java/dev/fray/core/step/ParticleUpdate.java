package dev.fray.core.step;

import dev.fray.core.grid.BlockLayout;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ParticleStore;

/**
 * What happens to each particle after the gather besides the move: the material law's projection of the
 * deformation gradient (the return mapping of plastic laws), per run of one body's particles in a block. Laws that
 * do not project are skipped (they say so through {@link MaterialLaw#projectsDeformation()}).
 */
public final class ParticleUpdate {
    private final ParticleStore store;
    private final BlockLayout layout;
    private final MaterialLaw[] laws;
    private final boolean any;

    /** @param ctx the step context */
    public ParticleUpdate(StepContext ctx) {
        this.store = ctx.store();
        this.layout = ctx.layout();
        this.laws = ctx.laws();
        boolean projects = false;
        for (MaterialLaw law : laws) {
            projects |= law.projectsDeformation();
        }
        this.any = projects;
    }

    /**
     * Projects the deformation of particle block r's particles.
     *
     * @param r the particle block
     * @return the first particle whose return mapping failed, or -1
     */
    public int project(int r) {
        if (!any) {
            return -1;
        }
        int failed = -1;
        int[] body = store.body();
        int end = layout.end(r);
        for (int runStart = layout.start(r); runStart < end; ) {
            int b = body[runStart];
            int runEnd = runStart + 1;
            while (runEnd < end && body[runEnd] == b) {
                runEnd++;
            }
            if (laws[b].projectsDeformation()) {
                int f = laws[b].projectDeformation(store, runStart, runEnd);
                if (f >= 0 && failed < 0) {
                    failed = f;
                }
            }
            runStart = runEnd;
        }
        return failed;
    }
}
