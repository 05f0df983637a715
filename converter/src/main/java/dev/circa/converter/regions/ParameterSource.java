package dev.circa.converter.regions;

import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.io.FormatException;
import java.nio.file.Path;

/**
 * Where the parameters of a region graph's circuit come from: a seed ({@link RegionParameters#seeded})
 * or a NumPy archive in the layout of FORMAT.md section 3 ({@link RegionParameters#fromArchive}). An
 * archive named by path is read only when {@link #load} is called, so that {@link RegionConverter}'s
 * size guards come first. Immutable.
 */
public final class ParameterSource {
    private final long seed;
    private final Path file;
    private final NpzArchive archive;

    private ParameterSource(long seed, Path file, NpzArchive archive) {
        this.seed = seed;
        this.file = file;
        this.archive = archive;
    }

    /** Parameters drawn from {@code seed}. */
    public static ParameterSource seed(long seed) {
        return new ParameterSource(seed, null, null);
    }

    /** Parameters read from the NumPy archive {@code file} when loaded. */
    public static ParameterSource file(Path file) {
        return new ParameterSource(0, file, null);
    }

    /** Parameters from an archive already read (or built in memory). */
    public static ParameterSource archive(NpzArchive archive) {
        return new ParameterSource(0, null, archive);
    }

    /** The parameter file, or {@code null} when the parameters are seeded or in memory. */
    public Path path() {
        return file;
    }

    /**
     * The parameters for {@code s} under {@code o}.
     *
     * @param maxBytes the largest archive entry to read ({@code --max-bytes})
     * @throws FormatException when the archive cannot be read or does not fit the layout
     */
    public RegionParameters load(RegionStructure s, CompileOptions o, long maxBytes) throws FormatException {
        if (file != null) {
            return RegionParameters.fromArchive(s, o, NpzArchive.read(file, maxBytes));
        }
        if (archive != null) {
            return RegionParameters.fromArchive(s, o, archive);
        }
        return RegionParameters.seeded(s, o, seed);
    }

    /** What a circuit's provenance says about its parameters: {@code seed S} or {@code parameters FILE}. */
    public String describe() {
        if (file != null) {
            return "parameters " + file;
        }
        if (archive != null) {
            return "parameters " + (archive.source() == null ? "(in memory)" : archive.source());
        }
        return "seed " + seed;
    }
}
