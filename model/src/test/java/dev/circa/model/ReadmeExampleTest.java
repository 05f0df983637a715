package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.StringWriter;
import java.lang.reflect.Method;
import java.net.URL;
import java.net.URLClassLoader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.tools.JavaCompiler;
import javax.tools.ToolProvider;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The Java example of the README's "Use circa from Java" section, extracted, compiled with javax.tools
 * against this module's classpath and run on the bundled model; its printed numbers against the SciPy
 * values of FORMAT.md and commons-math3 3.6.1.
 */
class ReadmeExampleTest {
    private static final Path README = Path.of("..", "README.md");

    /** The first ```java block after the section heading. */
    private static String example() throws Exception {
        String text = Files.readString(README, StandardCharsets.UTF_8);
        int section = text.indexOf("\n## Use circa from Java\n");
        assertTrue(section >= 0, "README.md has the section \"Use circa from Java\"");
        int next = text.indexOf("\n## ", section + 1);
        String body = text.substring(section, next < 0 ? text.length() : next);
        Matcher m = Pattern.compile("```java\n(.*?)```", Pattern.DOTALL).matcher(body);
        assertTrue(m.find(), "the section has a ```java block");
        return m.group(1);
    }

    @Test
    void readmeJavaExample_compilesAndRunsOnTheBundledModel(@TempDir Path dir) throws Exception {
        String source = example();
        Matcher name = Pattern.compile("public class (\\w+)").matcher(source);
        assertTrue(name.find(), "the example is a public class");
        Path file = dir.resolve(name.group(1) + ".java");
        Files.writeString(file, source, StandardCharsets.UTF_8);

        JavaCompiler javac = ToolProvider.getSystemJavaCompiler();
        StringWriter diagnostics = new StringWriter();
        List<String> options = List.of("-classpath", System.getProperty("java.class.path"), "-d", dir.toString(),
                "--release", "17", "-Xlint:all", "-Werror");
        boolean compiled = javac.getTask(diagnostics, null, null, options, null,
                javac.getStandardFileManager(null, null, StandardCharsets.UTF_8).getJavaFileObjects(file.toFile())).call();
        assertTrue(compiled, diagnostics.toString());

        ByteArrayOutputStream printed = new ByteArrayOutputStream();
        PrintStream out = System.out;
        try (URLClassLoader loader = new URLClassLoader(new URL[] {dir.toUri().toURL()}, getClass().getClassLoader())) {
            Method main = loader.loadClass(name.group(1)).getMethod("main", String[].class);
            System.setOut(new PrintStream(printed, true, StandardCharsets.UTF_8));
            main.invoke(null, (Object) new String[] {Fixtures.PUMP_STATION.toString()});
        } finally {
            System.setOut(out);
        }
        List<Double> numbers = new ArrayList<>();
        List<String> lines = printed.toString(StandardCharsets.UTF_8).lines().toList();
        for (String line : lines) {
            numbers.add(Double.parseDouble(line.substring(line.lastIndexOf(' ') + 1)));
        }
        assertEquals(7, numbers.size(), String.join("\n", lines));
        // source: FORMAT.md, SciPy 1.10
        assertEquals(Fixtures.SCIPY_FULL, numbers.get(0), 1e-12);
        assertEquals(Fixtures.SCIPY_MARGINAL, numbers.get(1), 1e-12);
        // source: commons-math3 3.6.1 NormalDistribution, weighted as in the example circuit
        assertEquals(Math.log(Fixtures.exampleDensity(3.0, 2) / Fixtures.exampleDensity(3.0, -1)), numbers.get(2), 1e-12);
        double[] pressures = {2.0, 2.5, 3.0, 3.5};
        for (int r = 0; r < 4; r++) {
            assertEquals(Math.log(Fixtures.exampleDensity(pressures[r], 1)), numbers.get(3 + r), 1e-12, lines.get(3 + r));
        }
    }
}
