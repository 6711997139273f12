package org.headwater.testing;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Base64;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import java.util.function.Predicate;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.openqa.selenium.bidi.BiDi;
import org.openqa.selenium.bidi.Command;
import org.openqa.selenium.bidi.Connection;
import org.openqa.selenium.bidi.Event;
import org.openqa.selenium.remote.http.ClientConfig;
import org.openqa.selenium.remote.http.HttpClient;

/**
 * Debian's headless Firefox ESR, driven over its own WebDriver BiDi remote agent (W3C WebDriver BiDi;
 * Debian ships no geckodriver). Selenium's BiDi {@link Connection} carries the commands; the few commands
 * the UI tests need are sent by name with their parameters as the specification defines them.
 */
public final class Firefox implements AutoCloseable {
    private static final Path FIREFOX = Path.of("/usr/bin/firefox-esr");
    private static final Duration COMMAND_TIME = Duration.ofSeconds(30);
    private static final Pattern LISTENING = Pattern.compile("WebDriver BiDi listening on (ws://\\S+)");

    /**
     * Preferences that stop Firefox's background connections (updates, telemetry, safe browsing, remote
     * settings, captive-portal and connectivity checks): the build network allows loopback only. Names
     * from memory of Firefox's preference list; the remote agent sets its own recommended set on top.
     */
    private static final Map<String, Object> PREFS = Map.ofEntries(
            Map.entry("app.update.disabledForTesting", true),
            Map.entry("app.normandy.enabled", false),
            Map.entry("browser.safebrowsing.malware.enabled", false),
            Map.entry("browser.safebrowsing.phishing.enabled", false),
            Map.entry("browser.safebrowsing.downloads.enabled", false),
            Map.entry("browser.safebrowsing.provider.mozilla.updateURL", ""),
            Map.entry("browser.shell.checkDefaultBrowser", false),
            Map.entry("browser.startup.homepage_override.mstone", "ignore"),
            Map.entry("browser.newtabpage.enabled", false),
            Map.entry("browser.region.network.url", ""),
            Map.entry("datareporting.healthreport.uploadEnabled", false),
            Map.entry("datareporting.policy.dataSubmissionEnabled", false),
            Map.entry("toolkit.telemetry.enabled", false),
            Map.entry("toolkit.telemetry.server", "http://127.0.0.1:9/"),
            Map.entry("extensions.update.enabled", false),
            Map.entry("extensions.getAddons.cache.enabled", false),
            Map.entry("messaging-system.rsexperimentloader.enabled", false),
            Map.entry("services.settings.server", "http://127.0.0.1:9/"),
            Map.entry("network.captive-portal-service.enabled", false),
            Map.entry("network.connectivity-service.enabled", false),
            Map.entry("network.dns.disablePrefetch", true),
            Map.entry("network.prefetch-next", false),
            Map.entry("dom.disable_open_during_load", false));

    private final Process process;
    private final Path profile;
    private final BiDi bidi;
    private final String context;
    private final List<Map<String, Object>> log = new CopyOnWriteArrayList<>();
    private final List<String> failedRequests = new CopyOnWriteArrayList<>();
    private final List<String> prompts = new CopyOnWriteArrayList<>();

    private Firefox(Process process, Path profile, BiDi bidi) {
        this.process = process;
        this.profile = profile;
        this.bidi = bidi;
        send("session.new", Map.of("capabilities", Map.of("alwaysMatch", Map.of("acceptInsecureCerts", false))));
        List<?> contexts = (List<?>) send("browsingContext.getTree", Map.of()).get("contexts");
        this.context = (String) ((Map<?, ?>) contexts.get(0)).get("context");
        bidi.addListener(new Event<Map<String, Object>>("log.entryAdded", m -> m), log::add);
        bidi.addListener(new Event<Map<String, Object>>("network.responseCompleted", m -> m), this::response);
        bidi.addListener(new Event<Map<String, Object>>("browsingContext.userPromptOpened", m -> m),
                m -> prompts.add(String.valueOf(m.get("message"))));
    }

    /** True when Debian's firefox-esr is installed. */
    public static boolean available() {
        return Files.isExecutable(FIREFOX);
    }

    /** Skips (laptop) or fails (CI) when Firefox is missing, else starts it headless with a fresh profile. */
    public static Firefox start() throws IOException {
        External.need(available(), "firefox-esr (apt-get install firefox-esr)");
        Path profile = Files.createTempDirectory("headwater-firefox-");
        StringBuilder prefs = new StringBuilder();
        PREFS.forEach((k, v) -> prefs.append("user_pref(\"").append(k).append("\", ")
                .append(v instanceof String s ? "\"" + s + "\"" : v).append(");\n"));
        Files.writeString(profile.resolve("user.js"), prefs, StandardCharsets.UTF_8);
        Path output = profile.resolve("firefox.log");
        Process process = new ProcessBuilder(FIREFOX.toString(), "--headless", "--no-remote", "--remote-debugging-port=0",
                "--profile", profile.toString(), "about:blank")
                .redirectErrorStream(true).start();
        CompletableFuture<String> address = new CompletableFuture<>();
        Thread drain = new Thread(() -> {
            try (BufferedReader in = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8));
                    var out = Files.newBufferedWriter(output, StandardCharsets.UTF_8)) {
                for (String line; (line = in.readLine()) != null; ) {
                    Matcher m = LISTENING.matcher(line);
                    if (m.find()) {
                        address.complete(m.group(1));
                    }
                    out.write(line);
                    out.newLine();
                    out.flush();
                }
            } catch (IOException e) {
                address.completeExceptionally(e);
            }
            address.completeExceptionally(new IOException("Firefox ended before its remote agent listened; see " + output));
        }, "firefox-output");
        drain.setDaemon(true);
        drain.start();
        try {
            String ws = address.get(60, TimeUnit.SECONDS) + "/session";
            HttpClient client = HttpClient.Factory.createDefault()
                    .createClient(ClientConfig.defaultConfig().baseUri(URI.create(ws)).readTimeout(COMMAND_TIME));
            return new Firefox(process, profile, new BiDi(new Connection(client, ws), COMMAND_TIME));
        } catch (Exception e) {
            process.destroyForcibly();
            throw new IOException("Firefox did not start: " + e.getMessage(), e);
        }
    }

    /** Sends one BiDi command and returns its result object. */
    @SuppressWarnings("unchecked")
    public Map<String, Object> send(String method, Map<String, Object> params) {
        return (Map<String, Object>) bidi.send(new Command<>(method, params, Map.class), COMMAND_TIME);
    }

    /** Loads a page and waits for its load event (browsingContext.navigate, wait "complete"). */
    public void navigate(String url) {
        send("browsingContext.navigate", Map.of("context", context, "url", url, "wait", "complete"));
    }

    /**
     * Evaluates a function body in the page with the given arguments (strings, numbers, booleans, or
     * {@link Node}s) and returns its value as plain Java (String, Double, Boolean, List, Map, Node, null).
     * A returned promise is awaited.
     */
    public Object call(String body, Object... args) {
        List<Object> arguments = new ArrayList<>();
        for (Object a : args) {
            arguments.add(local(a));
        }
        Map<String, Object> params = new LinkedHashMap<>();
        params.put("functionDeclaration", "async function () { " + body + " }");
        params.put("target", Map.of("context", context));
        params.put("arguments", arguments);
        params.put("awaitPromise", true);
        params.put("resultOwnership", "none");
        params.put("serializationOptions", Map.of("maxDomDepth", 0, "maxObjectDepth", 4));
        Map<String, Object> answer = send("script.callFunction", params);
        if ("exception".equals(answer.get("type"))) {
            Map<?, ?> details = (Map<?, ?>) answer.get("exceptionDetails");
            throw new IllegalStateException("script threw: " + details.get("text"));
        }
        return value((Map<?, ?>) answer.get("result"));
    }

    /** A DOM node handed out by the browser, to pass back to commands. */
    public record Node(String sharedId) {
    }

    /** Every node matching a CSS selector, in document order (browsingContext.locateNodes). */
    public List<Node> nodes(String css) {
        Map<String, Object> answer = send("browsingContext.locateNodes", Map.of("context", context,
                "locator", Map.of("type", "css", "value", css)));
        List<Node> nodes = new ArrayList<>();
        for (Object n : (List<?>) answer.get("nodes")) {
            nodes.add(new Node((String) ((Map<?, ?>) n).get("sharedId")));
        }
        return nodes;
    }

    /** Waits until a node matching the selector is visible (has a layout box), and returns it. */
    public Node waitFor(String css) {
        waitUntil("a visible " + css, () -> Boolean.TRUE.equals(call(
                "const e = document.querySelector(arguments[0]); return !!e && e.getClientRects().length > 0;", css)));
        return nodes(css).get(0);
    }

    /** Polls a condition every 100 ms for up to 15 s. */
    public void waitUntil(String what, java.util.function.BooleanSupplier condition) {
        long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(15);
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > end) {
                throw new AssertionError("Firefox: timed out waiting for " + what);
            }
            pause(100);
        }
    }

    /** A real mouse click in the middle of the node (input.performActions). */
    public void click(Node node) {
        call("arguments[0].scrollIntoView({block: 'center'});", node);
        Map<String, Object> origin = Map.of("type", "element", "element", Map.of("sharedId", node.sharedId()));
        perform(Map.of("type", "pointer", "id", "mouse", "parameters", Map.of("pointerType", "mouse"), "actions", List.of(
                Map.of("type", "pointerMove", "x", 0, "y", 0, "origin", origin),
                Map.of("type", "pointerDown", "button", 0),
                Map.of("type", "pointerUp", "button", 0))));
    }

    /** Types text into whatever has the focus, one key at a time; a key may be a WebDriver key code point. */
    public void type(String text) {
        List<Map<String, Object>> keys = new ArrayList<>();
        text.codePoints().forEach(c -> {
            String key = new String(Character.toChars(c));
            keys.add(Map.of("type", "keyDown", "value", key));
            keys.add(Map.of("type", "keyUp", "value", key));
        });
        perform(Map.of("type", "key", "id", "keyboard", "actions", keys));
    }

    private void perform(Map<String, Object> source) {
        send("input.performActions", Map.of("context", context, "actions", List.of(source)));
        send("input.releaseActions", Map.of("context", context));
    }

    /** Sets the files of an {@code <input type=file>} as if the user had picked them (input.setFiles). */
    public void setFiles(Node input, Path... files) {
        List<String> paths = new ArrayList<>();
        for (Path f : files) {
            paths.add(f.toAbsolutePath().toString());
        }
        send("input.setFiles", Map.of("context", context, "element", Map.of("sharedId", input.sharedId()), "files", paths));
    }

    /** Resizes the page's viewport (browsingContext.setViewport). */
    public void viewport(int width, int height) {
        send("browsingContext.setViewport", Map.of("context", context, "viewport", Map.of("width", width, "height", height)));
    }

    /** Writes a PNG of the viewport to {@code target/screenshots/NAME.png}. */
    public Path screenshot(String name) throws IOException {
        Path dir = Path.of("target", "screenshots");
        Files.createDirectories(dir);
        Path file = dir.resolve(name + ".png");
        String data = (String) send("browsingContext.captureScreenshot", Map.of("context", context)).get("data");
        Files.write(file, Base64.getDecoder().decode(data));
        return file;
    }

    /** Log entries of level error since the start: script errors and {@code console.error} calls. */
    public List<String> errors() {
        return log.stream().filter(e -> "error".equals(e.get("level")))
                .map(e -> e.get("type") + ": " + e.get("text")).toList();
    }

    /** Requests answered with a 4xx or 5xx status since the start, as "STATUS URL". */
    public List<String> failedRequests() {
        return List.copyOf(failedRequests);
    }

    /** The messages of every alert, confirm or prompt the pages opened. */
    public List<String> prompts() {
        return List.copyOf(prompts);
    }

    /** Drops what the error lists hold so far. */
    public void forgetErrors() {
        log.clear();
        failedRequests.clear();
    }

    /** The messages of log entries matching a filter. */
    public List<String> logTexts(Predicate<Map<String, Object>> which) {
        return log.stream().filter(which).map(e -> String.valueOf(e.get("text"))).toList();
    }

    private void response(Map<String, Object> event) {
        Map<?, ?> response = (Map<?, ?>) event.get("response");
        Map<?, ?> request = (Map<?, ?>) event.get("request");
        int status = ((Number) response.get("status")).intValue();
        if (status >= 400) {
            failedRequests.add(status + " " + request.get("url"));
        }
    }

    private static Object local(Object a) {
        if (a instanceof Node n) {
            return Map.of("sharedId", n.sharedId());
        }
        if (a instanceof String s) {
            return Map.of("type", "string", "value", s);
        }
        if (a instanceof Boolean b) {
            return Map.of("type", "boolean", "value", b);
        }
        if (a instanceof Number n) {
            return Map.of("type", "number", "value", n);
        }
        throw new IllegalArgumentException("cannot pass " + a);
    }

    /** A BiDi remote value as plain Java (WebDriver BiDi, script.RemoteValue). */
    private static Object value(Map<?, ?> remote) {
        Object v = remote.get("value");
        return switch (String.valueOf(remote.get("type"))) {
            case "undefined", "null" -> null;
            case "string", "boolean" -> v;
            case "number" -> v instanceof Number n ? n.doubleValue() : Double.valueOf(String.valueOf(v));
            case "array", "nodelist", "htmlcollection" -> {
                List<Object> list = new ArrayList<>();
                for (Object item : (List<?>) v) {
                    list.add(value((Map<?, ?>) item));
                }
                yield list;
            }
            case "object" -> {
                Map<String, Object> map = new LinkedHashMap<>();
                for (Object pair : (List<?>) v) {
                    List<?> kv = (List<?>) pair;
                    map.put(String.valueOf(kv.get(0)), value((Map<?, ?>) kv.get(1)));
                }
                yield map;
            }
            case "node" -> new Node((String) remote.get("sharedId"));
            default -> String.valueOf(v);
        };
    }

    private static void pause(long millis) {
        try {
            Thread.sleep(millis);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
    }

    @Override
    public void close() throws IOException {
        // Closing the socket first and then ending the process (SIGTERM, which Firefox handles by quitting)
        // avoids a warning from a connection closed under Selenium by browser.close.
        bidi.close();
        try {
            process.destroy();
            if (!process.waitFor(10, TimeUnit.SECONDS)) {
                process.destroyForcibly().waitFor(10, TimeUnit.SECONDS);
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        try (var walk = Files.walk(profile)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }
}
