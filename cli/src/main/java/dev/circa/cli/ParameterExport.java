package dev.circa.cli;

import dev.circa.format.Counts;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.converter.regions.RegionConverter;
import dev.circa.format.CircuitDocument;
import dev.circa.format.regions.RegionGraph;
import dev.circa.format.regions.RegionGraphReader;
import java.nio.file.Path;

/** {@code circa convert --to-params}: a compiled circuit's parameters back in the layout of FORMAT.md section 3. */
final class ParameterExport {
    private ParameterExport() {
    }

    /** Writes the parameters of {@code circuitFile}, compiled from {@code regions}, to {@code target}; the exit status. */
    static int run(Path circuitFile, Path regions, Path target, ReadOptions read) throws Exception {
        if (regions == null) {
            throw new UsageException("--to-params needs --regions RG.json, the region graph the circuit was compiled from");
        }
        CircuitDocument circuit = read.load(circuitFile).document();
        RegionGraph graph = new RegionGraphReader(read.limits()).read(regions);
        NpzArchive archive = RegionConverter.exportParameters(circuit, graph);
        archive.write(target, false, circuitFile, regions);
        read.err().println("wrote " + Counts.of(archive.size(), "array") + " to " + target);
        return ExitStatus.OK;
    }
}
