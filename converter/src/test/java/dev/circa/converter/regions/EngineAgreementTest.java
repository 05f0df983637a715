package dev.circa.converter.regions;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.VariableType;
import dev.circa.format.regions.RegionGraph;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Validator;
import dev.circa.validator.Verdict;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** The compiled circuits through the engine and the validator (each checked against outside values in its module). */
class EngineAgreementTest {
    private static final double TOL = 1e-9;

    @Test
    void engine_exampleWithNumpyParams_reproducesScipyReference() throws Exception {
        // Source: shared/data/npz/example-reference.csv (NumPy 1.24 / SciPy 1.10), through the engine's Evaluator.
        CircuitDocument doc = RegionCompiler.compile(RegionCompilerTest.example(), RegionCompilerTest.k3i2c1(),
                RegionCompilerTest.exampleParams());
        List<double[]> rows = RegionCompilerTest.referenceRows();
        double[] data = new double[rows.size() * 4];
        for (int i = 0; i < rows.size(); i++) {
            System.arraycopy(rows.get(i), 0, data, i * 4, 4);
        }
        double[] out = new double[rows.size()];
        new Evaluator(CompiledCircuit.compile(doc)).logDensity(data, rows.size(), out);
        for (int i = 0; i < rows.size(); i++) {
            double want = rows.get(i)[4];
            assertTrue(Math.abs(out[i] - want) <= TOL + TOL * Math.abs(want), "row " + i + ": " + out[i] + " vs " + want);
        }
    }

    @Test
    void verify_engineAgainstRegionTensors_agreeWithMissingValues() throws Exception {
        RegionStructure example = RegionStructure.of(RegionCompilerTest.example());
        List<RegionParameters> cases = List.of(
                RegionParameters.fromArchive(example, RegionCompilerTest.k3i2c1(), RegionCompilerTest.exampleParams()),
                RegionParameters.seeded(RegionStructure.of(RegionCompilerTest.mixedGraph()), new CompileOptions(3, 2, 2,
                        Map.of(VariableType.REAL, Family.GAMMA, VariableType.COUNT, Family.BINOMIAL)), 4),
                RegionParameters.seeded(RegionStructure.of(GridRegions.generate(3, 3)), new CompileOptions(3, 3, 1, Map.of()), 5),
                RegionParameters.seeded(RegionStructure.of(RandomRegions.generate(RandomRegions.realVariables(10), 3, 3, 6)),
                        new CompileOptions(2, 3, 3, Map.of(VariableType.REAL, Family.LOGNORMAL)), 6));
        for (RegionParameters p : cases) {
            CompiledCircuit c = CompiledCircuit.compile(RegionCompiler.compile(p));
            RegionVerifier.Result r = RegionVerifier.verify(p, c, 200, 11, TOL, TOL);
            if (p.structure() != example) {
                // seeded parameters are normalised, so every output integrates to 1 (FORMAT.md, normalized)
                for (double z : new Evaluator(c).logPartition()) {
                    assertEquals(0, z, 1e-12);
                }
            }
            assertTrue(r.passed(), r.summary());
            assertEquals(601, r.points());
        }
    }

    @Test
    void verify_engineOnOtherParameters_fails() throws Exception {
        RegionStructure s = RegionStructure.of(GridRegions.generate(2, 2));
        CompileOptions o = new CompileOptions(2, 2, 1, Map.of());
        CompiledCircuit other = CompiledCircuit.compile(RegionCompiler.compile(RegionParameters.seeded(s, o, 1)));
        RegionVerifier.Result r = RegionVerifier.verify(RegionParameters.seeded(s, o, 2), other, 20, 3, TOL, TOL);
        assertTrue(!r.passed() && r.failures() > 0 && r.maxAbsDifference() > 1e-3, r.summary());
    }

    @Test
    void validator_compiledCircuits_propertiesAsFormatSays() throws Exception {
        // FORMAT.md section 3: smooth and decomposable by construction; structured-decomposable with one
        // partition per inner region, not when the root's partitions split it in different ways.
        record Case(RegionGraph graph, boolean structured) {
        }
        List<Case> cases = List.of(new Case(GridRegions.generate(2, 3), true),
                new Case(RandomRegions.generate(RandomRegions.realVariables(8), 3, 1, 2), true),
                new Case(RegionCompilerTest.example(), false),
                new Case(RandomRegions.generate(RandomRegions.realVariables(6), 2, 3, 2), false));
        Validator v = new Validator(ValidationOptions.defaults());
        for (Case c : cases) {
            CircuitDocument doc = RegionCompiler.compile(c.graph(), new CompileOptions(2, 2, 1, Map.of()), 3);
            ValidationReport report = v.validate(doc);
            assertTrue(report.valid(), report.toString());
            assertEquals(Verdict.TRUE, report.property(Property.SMOOTH));
            assertEquals(Verdict.TRUE, report.property(Property.DECOMPOSABLE));
            assertEquals(Verdict.TRUE, report.property(Property.NORMALIZED));
            assertEquals(c.structured() ? Verdict.TRUE : Verdict.FALSE, report.property(Property.STRUCTURED_DECOMPOSABLE),
                    report.toString());
            assertEquals(c.structured(), CircuitMath.structuredDecomposable(doc));
        }
    }
}
