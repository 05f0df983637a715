package dev.circa.cli;

import dev.circa.engine.CompiledCircuit;

/** Resolves an {@code --output-name} option to an output index. */
final class OutputChoice {
    private OutputChoice() {
    }

    static int index(CompiledCircuit c, String name) {
        if (name == null) {
            return 0;
        }
        int i = c.outputIndex(name);
        if (i < 0) {
            StringBuilder sb = new StringBuilder();
            for (int o = 0; o < c.outputCount(); o++) {
                sb.append(o == 0 ? "" : ", ").append(c.outputName(o));
            }
            throw new UsageException("the circuit has no output \"" + name + "\"; its outputs are " + sb);
        }
        return i;
    }
}
