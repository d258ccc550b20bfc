package dev.fray.core.sim;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleStore;

import java.util.List;

/** The read-only particle view handed to listeners and writers: indexed access and exports by particle id. */
final class StoreView implements ParticleView {
    private final ParticleStore store;

    StoreView(ParticleStore store) {
        this.store = store;
    }

    @Override
    public int size() {
        return store.size();
    }

    @Override
    public int id(int p) {
        return store.id()[p];
    }

    @Override
    public int body(int p) {
        return store.body()[p];
    }

    @Override
    public List<String> channelNames() {
        return store.channelNames();
    }

    @Override
    public ChannelSpec spec(String name) {
        ChannelSpec s = store.spec(name);
        if (s == null) {
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "particle channel", name,
                    store.channelNames());
        }
        return s;
    }

    @Override
    public double get(String name, int p, int component) {
        int w = spec(name).width();
        return store.channel(name)[w * p + component];
    }

    @Override
    public void copyById(String name, double[] dst, int off) {
        int w = spec(name).width();
        double[] src = store.channel(name);
        int[] id = store.id();
        for (int p = 0; p < store.size(); p++) {
            System.arraycopy(src, w * p, dst, off + w * id[p], w);
        }
    }
}
