package dev.circa.validator;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.schema.SchemaCatalog;
import dev.circa.format.schema.SchemaViolation;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** {@link SchemaCheck#BUNDLED}: the bundled circuit schema, through {@link SchemaCatalog#validateCircuit}. */
final class BundledSchemaCheck implements SchemaCheck {
    @Override
    public List<SchemaFinding> check(InputStream in, String file, ReadLimits limits) throws FormatException {
        return findings(SchemaCatalog.get().validateCircuit(in, file, limits));
    }

    /** A file can be read twice: nodes are checked without a tree, and only a doubtful one is read again as a tree. */
    @Override
    public List<SchemaFinding> check(Path file, ReadLimits limits) throws FormatException {
        return findings(SchemaCatalog.get().validateCircuit(file, limits));
    }

    private static List<SchemaFinding> findings(List<SchemaViolation> violations) {
        List<SchemaFinding> out = new ArrayList<>(violations.size());
        for (SchemaViolation v : violations) {
            out.add(new SchemaFinding(v.pointer(), v.keyword(), v.message()));
        }
        return out;
    }
}
