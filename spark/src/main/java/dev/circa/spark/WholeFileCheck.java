package dev.circa.spark;

import dev.circa.engine.CompiledCircuit;
import dev.circa.format.csv.CsvReader;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.TextDecoding;
import dev.circa.validator.regression.ReferenceSetReader;
import dev.circa.validator.regression.RegressionCheck;
import dev.circa.validator.regression.Tolerance;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import org.apache.spark.api.java.function.FlatMapFunction;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.input.PortableDataStream;
import scala.Tuple2;

/**
 * A reference CSV checked whole by one task, streamed from its bytes exactly as {@code circa check} reads
 * it (text encodings, {@code .gz}, {@code --max-bytes}); for a file whose records may span the splits
 * of the line reader (a quoted cell holding a line break) or whose text is not UTF-8 as the line reader
 * takes it. Gives one partial report per file.
 */
final class WholeFileCheck implements FlatMapFunction<Iterator<Tuple2<String, PortableDataStream>>, PartialReport> {
    private static final long serialVersionUID = 1L;
    private final Broadcast<SparkModel> model;
    private final String file;
    private final double atol;
    private final double rtol;

    WholeFileCheck(Broadcast<SparkModel> model, String file, Tolerance tolerance) {
        this.model = model;
        this.file = file;
        this.atol = tolerance.atol();
        this.rtol = tolerance.rtol();
    }

    @Override
    public Iterator<PartialReport> call(Iterator<Tuple2<String, PortableDataStream>> files) throws Exception {
        SparkModel m = model.value();
        CompiledCircuit c = m.compiled();
        List<String> outputs = m.outputNames();
        List<PartialReport> parts = new ArrayList<>();
        while (files.hasNext()) {
            PortableDataStream bytes = files.next()._2();
            try (InputStream stored = bytes.open();
                 InputStream in = InputFiles.decoded(stored, file, InputFiles.isGzipName(file), m.limits().maxBytes());
                 CsvReader csv = new CsvReader(TextDecoding.reader(in, file), file, m.limits())) {
                RegressionCheck check = new RegressionCheck(c, new Tolerance(atol, rtol));
                check.checkReference(new ReferenceSetReader(csv, c.variables(), outputs));
                parts.add(new PartialReport(check.report()));
            }
        }
        return parts.iterator();
    }
}
