package dev.fray.io.mesh;

import com.code_intelligence.jazzer.junit.FuzzTest;

/**
 * Fuzz targets for the three mesh readers (Jazzer). In a normal build they run in regression mode over the
 * committed seed corpora in {@code src/test/resources/dev/fray/io/mesh/MeshReaderFuzzTestInputs/<method>/}
 * (valid and broken files); with JAZZER_FUZZ=1 one target is fuzzed for real, for example
 * {@code JAZZER_FUZZ=1 mvn -pl io test -Dtest=MeshReaderFuzzTest#ply}. Each input must give a valid mesh or an
 * InvalidInputException with key FILE_ERROR, quickly ({@link ReaderContract}).
 *
 * <p>Not a FrayTestBase: the fuzzer itself writes to the standard streams.
 */
class MeshReaderFuzzTest {
    @FuzzTest(maxDuration = "10m")
    void obj(byte[] data) {
        ReaderContract.check(ReaderContract.Format.OBJ, data, false);
    }

    @FuzzTest(maxDuration = "10m")
    void stl(byte[] data) {
        ReaderContract.check(ReaderContract.Format.STL, data, false);
    }

    @FuzzTest(maxDuration = "10m")
    void ply(byte[] data) {
        ReaderContract.check(ReaderContract.Format.PLY, data, false);
    }
}
