package dev.circa.bench;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;

/**
 * Writes a seeded synthetic circuit file of a given size straight to disk (never holding the circuit
 * in memory, so that a read measured afterwards is not disturbed): the pump-station variables
 * repeated per station, inputs of every scalar family plus categorical and mvnormal, then products
 * and sums whose children are earlier nodes, one node per line, as the writer lays it out.
 * The structure is not smooth or decomposable; it exercises the reader, not the engine.
 */
public final class CircuitFileGenerator {
    private static final int STATIONS = 16;
    private static final String[] REAL = {"inlet_pressure", "outlet_pressure", "motor_current", "vibration"};

    private CircuitFileGenerator() {
    }

    /** Variables per station: 4 real, valve (categorical, 3 states), alarm (binary), restarts (count). */
    static int variableCount() {
        return STATIONS * 7;
    }

    /**
     * Writes a circuit of exactly {@code nodes} nodes to {@code file}.
     *
     * @return the number of child references written
     */
    public static long write(Path file, int nodes, long seed) throws IOException {
        SplittableRandom random = new SplittableRandom(seed);
        long edges = 0;
        try (Writer w = new BufferedWriter(Files.newBufferedWriter(file, StandardCharsets.UTF_8), 1 << 16)) {
            w.write("{\"format\":\"circa.circuit\",\"version\":\"1.0\",\"name\":\"pump-stations-synthetic\",\n");
            w.write("\"provenance\":{\"producer\":\"circa bench\",\"source\":\"CircuitFileGenerator seed " + seed + "\"},\n");
            w.write("\"variables\":[");
            for (int s = 0; s < STATIONS; s++) {
                for (String r : REAL) {
                    w.write((s == 0 && r == REAL[0] ? "" : ",") + "\n{\"name\":\"s" + s + "_" + r + "\",\"type\":\"real\"}");
                }
                w.write(",\n{\"name\":\"s" + s + "_valve\",\"type\":\"categorical\",\"states\":[\"closed\",\"half\",\"open\"]}");
                w.write(",\n{\"name\":\"s" + s + "_alarm\",\"type\":\"binary\"}");
                w.write(",\n{\"name\":\"s" + s + "_restarts\",\"type\":\"count\"}");
            }
            w.write("\n],\n\"nodes\":[");
            int inputs = Math.max(1, (int) (nodes * 0.6));
            StringBuilder sb = new StringBuilder(256);
            for (int i = 0; i < nodes; i++) {
                sb.setLength(0);
                sb.append(i == 0 ? "\n" : ",\n").append("{\"id\":").append(i);
                if (i < inputs) {
                    input(sb, random);
                } else if (random.nextInt(5) < 3) {
                    int k = 2 + random.nextInt(3);
                    sb.append(",\"product\":[");
                    for (int j = 0; j < k; j++) {
                        sb.append(j == 0 ? "" : ",").append(random.nextInt(i));
                    }
                    sb.append(']');
                    edges += k;
                } else {
                    int k = 2 + random.nextInt(7);
                    sb.append(",\"sum\":[");
                    for (int j = 0; j < k; j++) {
                        sb.append(j == 0 ? "" : ",").append(random.nextInt(i));
                    }
                    sb.append("],\"weights\":[");
                    for (int j = 0; j < k; j++) {
                        sb.append(j == 0 ? "" : ",").append(1.0 / k);
                    }
                    sb.append(']');
                    edges += k;
                }
                sb.append('}');
                w.append(sb);
            }
            w.write("\n],\n\"outputs\":[{\"name\":\"joint\",\"node\":" + (nodes - 1) + "}]}\n");
        }
        return edges;
    }

    private static void input(StringBuilder sb, SplittableRandom r) {
        int station = r.nextInt(STATIONS);
        int base = station * 7;
        int pick = r.nextInt(12);
        int real = base + r.nextInt(4);
        switch (pick) {
            case 0, 1, 2 -> sb.append(",\"input\":\"normal\",\"var\":").append(real)
                    .append(",\"mean\":").append(r.nextDouble() * 5).append(",\"sd\":").append(0.05 + r.nextDouble());
            case 3 -> sb.append(",\"input\":\"lognormal\",\"var\":").append(real)
                    .append(",\"mu\":").append(r.nextDouble()).append(",\"sigma\":").append(0.1 + r.nextDouble());
            case 4 -> sb.append(",\"input\":\"gamma\",\"var\":").append(real)
                    .append(",\"shape\":").append(1 + r.nextDouble()).append(",\"rate\":").append(0.5 + r.nextDouble());
            case 5 -> sb.append(",\"input\":\"exponential\",\"var\":").append(real).append(",\"rate\":").append(0.1 + r.nextDouble());
            case 6 -> sb.append(",\"input\":\"uniform\",\"var\":").append(real).append(",\"low\":0,\"high\":").append(1 + r.nextDouble());
            case 7 -> {
                double a = r.nextDouble();
                double b = r.nextDouble() * (1 - a);
                sb.append(",\"input\":\"categorical\",\"var\":").append(base + 4)
                        .append(",\"probs\":[").append(a).append(',').append(b).append(',').append(1 - a - b).append(']');
            }
            case 8 -> sb.append(",\"input\":\"bernoulli\",\"var\":").append(base + 5).append(",\"p\":").append(r.nextDouble());
            case 9 -> sb.append(",\"input\":\"poisson\",\"var\":").append(base + 6).append(",\"rate\":").append(0.1 + r.nextDouble() * 3);
            case 10 -> sb.append(",\"input\":\"binomial\",\"var\":").append(base + 6)
                    .append(",\"trials\":").append(1 + r.nextInt(10)).append(",\"p\":").append(r.nextDouble());
            default -> {
                double v0 = 0.1 + r.nextDouble();
                double v1 = 0.1 + r.nextDouble();
                double c = 0.5 * Math.sqrt(v0 * v1);
                sb.append(",\"input\":\"mvnormal\",\"vars\":[").append(base).append(',').append(base + 1)
                        .append("],\"mean\":[").append(3 + r.nextDouble()).append(',').append(5 + r.nextDouble())
                        .append("],\"cov\":[[").append(v0).append(',').append(c).append("],[").append(c).append(',').append(v1).append("]]");
            }
        }
    }

    /** Bytes as MiB with one decimal, for reports. */
    static String mib(long bytes) {
        return String.format(Locale.ROOT, "%.1f MiB", bytes / 1048576.0);
    }
}
