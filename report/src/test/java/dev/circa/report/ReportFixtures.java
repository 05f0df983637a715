package dev.circa.report;

import dev.circa.converter.mixture.MixtureConverter;
import dev.circa.converter.mixture.MixtureOptions;
import dev.circa.converter.npz.NpzArchive;
import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.converter.regions.RegionParameters;
import dev.circa.converter.regions.RegionStructure;
import dev.circa.engine.CompiledCircuit;
import dev.circa.format.CircuitDocument;
import dev.circa.format.io.CircuitReader;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureReader;
import dev.circa.format.regions.RegionGraphReader;
import dev.circa.format.io.CircuitWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/** The demo's pump-station models, built from the bundled fixtures, and reports of them written under target/. */
final class ReportFixtures {
    static final Path FIXTURES = Path.of("..", "fixtures");
    static final Path OUT = Path.of("target", "report-tests");

    private ReportFixtures() {
    }

    /** The hand-written regime mixture (fixtures/mixtures/pump-station-regimes.yaml) converted, as a file. */
    static Path regimes() throws Exception {
        CircuitDocument doc = MixtureConverter.convert(MixtureReader.read(
                FIXTURES.resolve("mixtures/pump-station-regimes.yaml"), ReadLimits.DEFAULT), MixtureOptions.DEFAULT).circuit();
        return save(doc, "regimes.circuit.json");
    }

    /** The region-graph model of the demo (fixtures/npz, 3 sums per region, 2 bundles per leaf region), as a file. */
    static Path stations() throws Exception {
        RegionStructure structure = RegionStructure.of(new RegionGraphReader(ReadLimits.DEFAULT)
                .read(FIXTURES.resolve("npz/example-regions.json")));
        CompileOptions options = new CompileOptions(3, 2, 1, CompileOptions.defaults().families());
        RegionParameters params = RegionParameters.fromArchive(structure, options,
                NpzArchive.read(FIXTURES.resolve("npz/example-params.npz"), ReadLimits.DEFAULT.maxBytes()));
        return save(RegionCompiler.compile(params), "stations.circuit.json");
    }

    /** The NumPy/SciPy reference log-densities of the stations model. */
    static Path stationsReference() {
        return FIXTURES.resolve("npz/example-reference.csv");
    }

    static Path save(CircuitDocument doc, String name) throws Exception {
        Files.createDirectories(OUT);
        Path file = OUT.resolve(name);
        new CircuitWriter().write(doc, file);
        return file;
    }

    /** The report of {@code file} as a string. */
    static String report(Path file, ReportOptions options) throws Exception {
        CircuitDocument doc = new CircuitReader(ReadLimits.DEFAULT).read(file);
        ReportSource src = ReportSource.of(file, doc, CompiledCircuit.compile(doc));
        StringWriter w = new StringWriter();
        ModelReport.write(src, options, w);
        return w.toString();
    }

    /** The report of {@code file} with {@code pairs} and {@code references}, saved as {@code name} under target/. */
    static Path reportFile(Path file, String pairs, List<Path> references, String name) throws Exception {
        CircuitDocument doc = new CircuitReader(ReadLimits.DEFAULT).read(file);
        ReportOptions options = ReportOptions.defaults("circa test").withReferences(references)
                .withPairs(VariablePairs.parse(pairs, doc.variables()));
        Path out = OUT.resolve(name);
        Files.writeString(out, report(file, options));
        return out;
    }
}
