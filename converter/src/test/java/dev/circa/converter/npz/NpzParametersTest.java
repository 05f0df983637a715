package dev.circa.converter.npz;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.RegionCompiler;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.SumNode;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.List;
import java.util.Map;
import java.util.zip.ZipEntry;
import java.util.zip.ZipOutputStream;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.junit.jupiter.api.Test;

/** FORMAT.md section 3: parameter arrays may be integer, float32, big-endian or Fortran order. */
class NpzParametersTest {
    @Test
    void compile_integerFloat32BigEndianFortranArrays_sameParameters() throws Exception {
        ByteBuffer trials = ByteBuffer.allocate(16).order(ByteOrder.LITTLE_ENDIAN).putLong(10).putLong(20);
        ByteBuffer p = ByteBuffer.allocate(8).order(ByteOrder.BIG_ENDIAN).putFloat(0.25f).putFloat(0.5f);
        ByteBuffer alarm = ByteBuffer.allocate(16).order(ByteOrder.LITTLE_ENDIAN).putDouble(0.1).putDouble(0.9);
        // Fortran order: column by column, so the rows are [0.3, 0.7] and [0.6, 0.4]
        ByteBuffer w = ByteBuffer.allocate(32).order(ByteOrder.LITTLE_ENDIAN).putDouble(0.3).putDouble(0.6)
                .putDouble(0.7).putDouble(0.4);
        ByteArrayOutputStream zip = new ByteArrayOutputStream();
        try (ZipOutputStream z = new ZipOutputStream(zip)) {
            entry(z, "r0.v0.trials.npy", NpzArchiveTest.npy(1,
                    "{'descr': '<i8', 'fortran_order': False, 'shape': (2,), }", trials.array()));
            entry(z, "r0.v0.p.npy", NpzArchiveTest.npy(1, "{'descr': '>f4', 'fortran_order': False, 'shape': (2,), }",
                    p.array()));
            entry(z, "r0.v1.p.npy", NpzArchiveTest.npy(2, "{'descr': '<f8', 'fortran_order': False, 'shape': (2,), }",
                    alarm.array()));
            entry(z, "r0.weights.npy", NpzArchiveTest.npy(3, "{'descr': '<f8', 'fortran_order': True, 'shape': (2, 2), }",
                    w.array()));
        }
        NpzArchive a = NpzArchive.read(new ByteArrayInputStream(zip.toByteArray()), "mixed.npz", 1 << 20);
        RegionGraph g = RegionGraph.builder().variables(List.of(Variable.of("restarts", VariableType.COUNT),
                Variable.of("alarm", VariableType.BINARY))).regions(List.of(new Region(0, new int[] {0, 1}))).build();
        CompileOptions o = new CompileOptions(1, 2, 2, Map.of(VariableType.COUNT, Family.BINOMIAL));
        CircuitDocument doc = RegionCompiler.compile(g, o, a);
        InputNode first = (InputNode) doc.nodes().get(0);
        assertArrayEquals(new double[] {10, 0.25}, first.params());
        InputNode second = (InputNode) doc.nodes().get(3);
        assertArrayEquals(new double[] {20, 0.5}, second.params());
        SumNode out0 = (SumNode) doc.nodes().get(doc.outputs().get(0).node());
        SumNode out1 = (SumNode) doc.nodes().get(doc.outputs().get(1).node());
        assertArrayEquals(new double[] {0.3, 0.7}, out0.weights());
        assertArrayEquals(new double[] {0.6, 0.4}, out1.weights());
        // commons-math3 3.6.1: P(restarts = 3) under out0 = 0.3 Bin(3; 10, 0.25) + 0.7 Bin(3; 20, 0.5)
        double want = Math.log(0.3 * new BinomialDistribution(null, 10, 0.25).probability(3)
                + 0.7 * new BinomialDistribution(null, 20, 0.5).probability(3));
        double[] got = new double[2];
        new dev.circa.engine.Evaluator(dev.circa.engine.CompiledCircuit.compile(doc))
                .logDensity(new double[] {3, Double.NaN}, 1, got);
        assertEquals(want, got[0], 1e-12 * Math.abs(want));
    }

    private static void entry(ZipOutputStream z, String name, byte[] bytes) throws IOException {
        z.putNextEntry(new ZipEntry(name));
        z.write(bytes);
        z.closeEntry();
    }
}
