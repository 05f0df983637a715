package dev.circa.spark;

import java.util.Map;
import org.apache.spark.sql.SparkSession;

/**
 * The Spark session of a command: the running one when there is one (an application or a test that
 * calls the command line), else a new one; local masters stay on the loopback with no web UI.
 */
final class Sessions {
    private Sessions() {
    }

    /** Whether this call created the session (then the caller stops it). */
    record Opened(SparkSession spark, boolean created) {
    }

    static Opened open(String master, Map<String, String> conf) {
        SparkSession running = SparkSession.getActiveSession().isDefined() ? SparkSession.getActiveSession().get()
                : SparkSession.getDefaultSession().isDefined() ? SparkSession.getDefaultSession().get() : null;
        if (running != null) {
            conf.forEach((k, v) -> running.conf().set(k, v));
            return new Opened(running, false);
        }
        SparkSession.Builder b = SparkSession.builder().master(master).appName("circa-spark")
                .config("spark.ui.enabled", "false");
        if (master.startsWith("local")) {
            b.config("spark.driver.bindAddress", "127.0.0.1").config("spark.driver.host", "127.0.0.1");
        } else {
            // a cluster's executors need circa's classes: the jar this class was loaded from
            String jar = CircaSpark.class.getProtectionDomain().getCodeSource().getLocation().getPath();
            if (jar.endsWith(".jar")) {
                b.config("spark.jars", jar);
            }
        }
        conf.forEach(b::config);
        SparkSession s = b.getOrCreate();
        s.sparkContext().setLogLevel("WARN");
        return new Opened(s, true);
    }
}
