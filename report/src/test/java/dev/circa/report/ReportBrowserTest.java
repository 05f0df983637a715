package dev.circa.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.File;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.logging.Level;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.Dimension;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.logging.LogEntry;
import org.openqa.selenium.logging.LogType;
import org.openqa.selenium.logging.LoggingPreferences;

/**
 * The demo model's reports in a real browser: Debian's headless Chromium driven by Selenium through Debian's
 * chromedriver (both at their Debian paths; .ci/run installs them). Every plot must be laid out with a
 * non-zero size and the browser must log no error. Screenshots go to target/report-screenshots/. The page is
 * a local file and the browser is told to resolve no host name, so nothing leaves the machine.
 */
class ReportBrowserTest {
    static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");
    static final Path SCREENSHOTS = Path.of("target", "report-screenshots");
    private static ChromeDriverService service;
    private static ChromeDriver driver;
    private static Path profile;

    @BeforeAll
    static void startBrowser() throws Exception {
        assertTrue(Files.isExecutable(CHROMIUM) && Files.isExecutable(CHROMEDRIVER), "this test needs Debian's "
                + "chromium and chromium-driver (apt-get install -y chromium chromium-driver; .ci/run does it)");
        profile = Files.createTempDirectory("circa-chromium-profile");
        service = new ChromeDriverService.Builder().usingDriverExecutable(CHROMEDRIVER.toFile()).usingAnyFreePort()
                .withLogFile(ReportFixtures.OUT.resolve("chromedriver.log").toFile()).build();
        Files.createDirectories(ReportFixtures.OUT);
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments("--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-default-apps",
                "--disable-extensions", "--host-resolver-rules=MAP * ~NOTFOUND", "--window-size=1280,2000",
                "--user-data-dir=" + profile.toAbsolutePath());
        LoggingPreferences logs = new LoggingPreferences();
        logs.enable(LogType.BROWSER, Level.ALL);
        options.setCapability("goog:loggingPrefs", logs);
        driver = new ChromeDriver(service, options);
    }

    @AfterAll
    static void stopBrowser() throws Exception {
        if (driver != null) {
            driver.quit();
        }
        if (service != null) {
            service.stop();
        }
        if (profile != null) {
            try (var walk = Files.walk(profile)) {
                walk.sorted(java.util.Comparator.reverseOrder()).map(Path::toFile).forEach(File::delete);
            }
        }
    }

    @Test
    void regimesReport_inChromium_everyPlotDrawnWithoutErrors() throws Exception {
        Path report = ReportFixtures.reportFile(ReportFixtures.regimes(),
                "inlet_pressure:outlet_pressure,valve:motor_current", List.of(), "regimes-browser.report.html");
        int plots = loadAndCheck(report, "regimes-report.png");
        assertEquals(6 + 2 + 1, plots, "6 marginals, 2 pairs, the structure");
    }

    @Test
    void stationsReport_withReference_inChromium_everyPlotDrawnWithoutErrors() throws Exception {
        Path report = ReportFixtures.reportFile(ReportFixtures.stations(), "inlet_pressure:motor_current", List.of(
                ReportFixtures.stationsReference()), "stations-browser.report.html");
        int plots = loadAndCheck(report, "stations-report.png");
        assertTrue(plots >= 2 + 1 + 1, "scatter, histogram, a pair, the structure");
    }

    /** Loads the page, checks every plot's laid-out size and the browser's log, saves a screenshot; returns the plot count. */
    private static int loadAndCheck(Path report, String screenshot) throws Exception {
        driver.manage().logs().get(LogType.BROWSER); // drop anything logged before this page
        driver.get(report.toAbsolutePath().toUri().toString());
        assertTrue(driver.getTitle().startsWith("Model report: "), driver.getTitle());
        List<WebElement> figures = driver.findElements(By.cssSelector("figure.plot"));
        assertTrue(!figures.isEmpty(), "the page has plots");
        for (WebElement f : figures) {
            WebElement svg = f.findElement(By.tagName("svg"));
            Dimension size = svg.getSize();
            String name = f.findElement(By.tagName("figcaption")).getText();
            assertTrue(size.getWidth() > 0 && size.getHeight() > 0, "plot \"" + name + "\" drawn at " + size);
            Long shapes = (Long) driver.executeScript(
                    "return arguments[0].querySelectorAll('path,rect,line,polyline,circle,ellipse').length;", svg);
            assertTrue(shapes > 10, "plot \"" + name + "\" has shapes (" + shapes + ")");
        }
        List<String> errors = new ArrayList<>();
        for (LogEntry e : driver.manage().logs().get(LogType.BROWSER)) {
            if (e.getLevel().intValue() >= Level.SEVERE.intValue()) {
                errors.add(e.getMessage());
            }
        }
        assertEquals(List.of(), errors, "no error in the browser console");
        Files.createDirectories(SCREENSHOTS);
        File shot = driver.getScreenshotAs(OutputType.FILE);
        Path target = SCREENSHOTS.resolve(screenshot);
        Files.copy(shot.toPath(), target, StandardCopyOption.REPLACE_EXISTING);
        assertTrue(Files.size(target) > 10_000, "a screenshot with content");
        driver.executeScript("document.getElementById('marginals').scrollIntoView();");
        Files.copy(driver.getScreenshotAs(OutputType.FILE).toPath(),
                SCREENSHOTS.resolve(screenshot.replace(".png", "-marginals.png")), StandardCopyOption.REPLACE_EXISTING);
        return figures.size();
    }
}
