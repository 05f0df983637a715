package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.OwnErrors;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Command-line mistakes are told in circa's words, naming the option or subcommand, with the nearest
 * known name when one is close (issue 15). Edit distance is Levenshtein's (common practice).
 */
class CliUsageMessagesTest {
    private static final String CIRCUIT = "../fixtures/circuits/pump-station.json";

    private static String firstLine(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        assertEquals(ExitStatus.UNUSABLE, status, err::toString);
        String first = err.toString().lines().findFirst().orElse("");
        assertNull(OwnErrors.libraryWording(err.toString()), err::toString);
        return first;
    }

    @Test
    void mistypedSubcommand_suggestsTheNearest() {
        assertEquals("circa: unknown subcommand 'validat'; did you mean 'validate'?", firstLine("validat", "x.json"));
        assertEquals("circa: unknown subcommand 'cnvert'; did you mean 'convert'?", firstLine("cnvert"));
        assertEquals("circa: unknown subcommand 'smaple'; did you mean 'sample'?", firstLine("smaple"));
        assertTrue(firstLine("frobnicate").startsWith("circa: unknown subcommand 'frobnicate'; the subcommands are validate, "));
    }

    @Test
    void mistypedOption_suggestsTheNearest() {
        assertEquals("circa: unknown option --formt; did you mean --format?", firstLine("validate", "--formt", "json", CIRCUIT));
        assertEquals("circa: unknown option --refrence; did you mean --reference?",
                firstLine("check", CIRCUIT, "--refrence", "r.csv"));
    }

    @Test
    void badlyTypedValues_nameTheOptionAndWhatItTakes() {
        assertEquals("circa: --max-nodes takes a whole number; got 'abc'", firstLine("eval", CIRCUIT, "--data", "x", "--max-nodes", "abc"));
        assertEquals("circa: -n takes a whole number; got '1.5'", firstLine("sample", CIRCUIT, "-n", "1.5"));
        assertEquals("circa: --atol takes a number; got 'tiny'", firstLine("compare", CIRCUIT, CIRCUIT, "--atol", "tiny"));
    }

    @Test
    void missingValuesAndArguments_areNamed() {
        assertEquals("circa: missing required option --data DATA.csv", firstLine("eval", CIRCUIT));
        assertEquals("circa: missing argument CIRCUIT", firstLine("inspect"));
        assertEquals("circa: --rule needs a value after it", firstLine("validate", CIRCUIT, "--rule"));
        assertEquals("circa: --seed is given more than once; give it once",
                firstLine("regions", "random", "--vars", "3", "--depth", "1", "--seed", "1", "--seed", "2", "-o", "-"));
    }

    @Test
    void nearest_isNullWhenNothingIsClose() {
        assertNull(UsageMessages.nearest("zzzzzzzz", List.of("validate", "convert")));
        assertEquals("inspect", UsageMessages.nearest("inspcet", List.of("validate", "inspect", "impute")));
    }
}
