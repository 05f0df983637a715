package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Bad option values are a usage error (status 2) naming the option, before any work, in every
 * command (issue 15). "Before any work" is shown by giving an input that does not exist: the
 * message is about the option, not about the file.
 */
class CliOptionValuesTest {
    private static final String MISSING = "no-such-file.json";

    private record Case(String option, String value, List<String> args) {
    }

    private static final List<Case> CASES = List.of(
            new Case("--atol", "NaN", List.of("check", MISSING)),
            new Case("--atol", "-1", List.of("check", MISSING)),
            new Case("--rtol", "Infinity", List.of("check", MISSING)),
            new Case("--atol", "NaN", List.of("compare", MISSING, MISSING + "2")),
            new Case("--rtol", "-Infinity", List.of("compare", MISSING, MISSING + "2")),
            new Case("--samples", "0", List.of("compare", MISSING, MISSING + "2")),
            new Case("--atol", "-1e-9", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--rtol", "NaN", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--sums", "0", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--inputs", "-2", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--outputs", "0", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--verify", "0", List.of("convert", MISSING, "-o", "out.json")),
            new Case("--tolerance", "NaN", List.of("validate", MISSING)),
            new Case("--max-enumeration", "0", List.of("validate", MISSING)),
            new Case("--max-nodes", "0", List.of("inspect", MISSING)),
            new Case("--max-bytes", "-5", List.of("eval", MISSING, "--data", "d.csv")),
            new Case("-n", "-1", List.of("sample", MISSING)),
            new Case("--repeats", "0", List.of("regions", "random", "--vars", "4", "--depth", "1", "-o", "rg.json")),
            new Case("--height", "0", List.of("regions", "grid", "--width", "2", "-o", "rg.json")));

    @Test
    void everyBadValue_status2_namingTheOption_beforeReadingAnything() {
        for (Case c : CASES) {
            List<String> args = new java.util.ArrayList<>(c.args());
            args.add(c.option());
            args.add(c.value());
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int status = Main.run(args.toArray(String[]::new), new PrintWriter(out, true), new PrintWriter(err, true));
            String first = err.toString().lines().findFirst().orElse("");
            assertEquals(ExitStatus.UNUSABLE, status, () -> args + ": " + err);
            assertTrue(first.startsWith("circa: " + c.option() + " takes "), () -> args + ": " + err);
            assertTrue(first.endsWith("; got " + c.value()) || first.endsWith("; got " + Long.parseLong(c.value())),
                    () -> args + ": " + err);
            assertTrue(!err.toString().contains(MISSING), () -> "read the input before judging the option: " + args + ": " + err);
        }
    }

    @Test
    void outputInAMissingFolder_orEmpty_orAFolder_status2BeforeAnyWork() {
        String mixture = "../fixtures/mixtures/pump-station-regimes.yaml";
        for (String[] args : List.of(
                new String[] {"convert", mixture, "-o", "nodir/out.json"},
                new String[] {"convert", mixture, "-o", ""},
                new String[] {"convert", mixture, "-o", ".."},
                new String[] {"sample", MISSING, "-n", "3", "-o", "nodir/s.csv"},
                new String[] {"regions", "grid", "--height", "2", "--width", "2", "-o", "nodir/rg.json"})) {
            StringWriter out = new StringWriter();
            StringWriter err = new StringWriter();
            int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
            String first = err.toString().lines().findFirst().orElse("");
            assertEquals(ExitStatus.UNUSABLE, status, () -> List.of(args) + ": " + err);
            assertTrue(first.startsWith("circa: " + args[args.length - 1] + ": ") || args[args.length - 1].isEmpty(),
                    () -> List.of(args) + ": " + err);
            assertTrue(first.contains("does not exist") || first.contains("the output name is empty") || first.contains("is a folder"),
                    () -> List.of(args) + ": " + err);
            // nothing was converted or read first
            assertTrue(!err.toString().contains("converted") && !err.toString().contains(MISSING), () -> List.of(args) + ": " + err);
        }
    }
}
