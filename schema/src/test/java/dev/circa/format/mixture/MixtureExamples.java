package dev.circa.format.mixture;

/** Mixture documents for the tests of every module. */
public final class MixtureExamples {
    /** The example of FORMAT.md section 4, verbatim (the contract). */
    public static final String FORMAT_EXAMPLE = """
            format: circa.mixture
            version: "1.0"
            name: pump-station-regimes
            variables:
              - {name: inlet_pressure, type: real, unit: bar}
              - {name: valve, type: categorical, states: [closed, half, open]}
            definitions:
              worn-valve: {var: valve, categorical: {closed: 0.6, half: 0.3, open: 0.1}}
            model:
              mixture:
                - weight: 0.85
                  label: normal-operation
                  product:
                    - {var: inlet_pressure, normal: {mean: 3.1, sd: 0.2}}
                    - {var: valve, categorical: {closed: 0.05, half: 0.15, open: 0.80}}
                - weight: 0.15
                  label: cavitation
                  product:
                    - {var: inlet_pressure, normal: {mean: 2.2, sd: 0.5}}
                    - {use: worn-valve}
            """;

    private MixtureExamples() {
    }
}
