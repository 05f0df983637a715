package dev.circa.validator;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The circuit's nodes moved from one record per node into flat columns ({@link dev.circa.format.NodeTable}),
 * read and analysed without a record per node: the validator's account of every fixture circuit and of 120
 * seeded broken random circuits (verdict, properties, log Z, statistics, every diagnostic with code,
 * severity, pointer, node, line, column and message, schema findings included; each document validated
 * from a file as {@code circa validate --schema-check always} does, so the schema check streams without
 * a tree per node) must be exactly what the validator wrote before the change ({@code findings-golden.txt}, written by {@link FindingsCorpus#main}
 * with the build of commit f4e4ced).
 */
class FindingsGoldenTest {
    @TempDir
    Path scratch;

    @Test
    void sameFindingsAsBeforeTheFlatTable() throws Exception {
        String golden;
        try (InputStream in = FindingsGoldenTest.class.getResourceAsStream("findings-golden.txt")) {
            golden = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        String now = FindingsCorpus.account(Path.of("..", "fixtures"), scratch);
        String[] want = golden.split("\n");
        String[] got = now.split("\n");
        for (int i = 0; i < Math.min(want.length, got.length); i++) {
            assertEquals(want[i], got[i], "line " + (i + 1) + " of the account differs");
        }
        assertEquals(want.length, got.length, "number of lines of the account");
    }
}
