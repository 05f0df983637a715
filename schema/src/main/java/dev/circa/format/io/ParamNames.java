package dev.circa.format.io;

import dev.circa.format.Family;
import java.util.HashSet;
import java.util.Set;

/** Every parameter name of every input family (plus {@code logProbs}). */
final class ParamNames {
    private static final Set<String> ALL = new HashSet<>();

    static {
        for (Family f : Family.values()) {
            ALL.addAll(f.parameters());
        }
        ALL.add("logProbs");
    }

    private ParamNames() {
    }

    static boolean isParameter(String name) {
        return ALL.contains(name);
    }
}
