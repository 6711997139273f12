package org.headwater.testing;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.logging.Level;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.TakesScreenshot;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.logging.LogEntry;
import org.openqa.selenium.logging.LogType;
import org.openqa.selenium.logging.LoggingPreferences;

/**
 * Debian's headless Chromium, driven through its chromedriver, for tests and benchmarks of the web UI.
 * Started with a fresh profile and with every background connection switched off: the build network
 * allows loopback only.
 */
public final class Browser implements AutoCloseable {
    private static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    private static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");

    private final ChromeDriver driver;
    private final Path profile;

    private Browser(ChromeDriver driver, Path profile) {
        this.driver = driver;
        this.profile = profile;
    }

    /** True when chromium and chromedriver are installed (Debian packages chromium, chromium-driver). */
    public static boolean available() {
        return Files.isExecutable(CHROMIUM) && Files.isExecutable(CHROMEDRIVER);
    }

    /** Skips (laptop) or fails (CI) when the browser is missing, else starts it. */
    public static Browser start() throws IOException {
        External.need(available(), "chromium and chromedriver (apt-get install chromium chromium-driver)");
        Path profile = Files.createTempDirectory("headwater-chromium-");
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toString());
        options.addArguments("--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--disable-dev-shm-usage", "--window-size=1400,1000", "--user-data-dir=" + profile);
        LoggingPreferences logs = new LoggingPreferences();
        logs.enable(LogType.BROWSER, Level.ALL);
        options.setCapability("goog:loggingPrefs", logs);
        ChromeDriverService service = new ChromeDriverService.Builder()
                .usingDriverExecutable(CHROMEDRIVER.toFile()).usingAnyFreePort().build();
        ChromeDriver driver = new ChromeDriver(service, options);
        driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(30));
        return new Browser(driver, profile);
    }

    public ChromeDriver driver() {
        return driver;
    }

    /** The browser console since the last call (Chromium hands each entry out once). */
    public List<LogEntry> console() {
        return driver.manage().logs().get(LogType.BROWSER).getAll();
    }

    /** Writes a PNG of the window to {@code target/screenshots/NAME.png} and returns its path. */
    public Path screenshot(String name) throws IOException {
        Path dir = Path.of("target", "screenshots");
        Files.createDirectories(dir);
        Path file = dir.resolve(name + ".png");
        Files.write(file, ((TakesScreenshot) driver).getScreenshotAs(OutputType.BYTES));
        return file;
    }

    @Override
    public void close() throws IOException {
        try {
            driver.quit();
        } finally {
            try (var walk = Files.walk(profile)) {
                walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }
}
