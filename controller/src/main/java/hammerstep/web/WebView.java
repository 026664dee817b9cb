package hammerstep.web;

import com.sun.net.httpserver.Authenticator;
import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpPrincipal;
import com.sun.net.httpserver.HttpServer;
import com.sun.net.httpserver.HttpsConfigurator;
import com.sun.net.httpserver.HttpsParameters;
import com.sun.net.httpserver.HttpsServer;
import hammerstep.mqtt.PemFiles;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.net.InetSocketAddress;
import java.net.URI;
import java.net.URLDecoder;
import java.security.GeneralSecurityException;
import java.security.MessageDigest;
import javax.crypto.Mac;
import javax.crypto.spec.SecretKeySpec;
import java.nio.charset.StandardCharsets;
import java.util.Base64;
import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLParameters;
import java.util.HashMap;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The line engineer's web view: the JDK's own HTTP server ({@code com.sun.net.httpserver}: no
 * dependency, a few hundred kilobytes of heap) on its own threads, reading what the station hands
 * over through the {@link LiveBoard}; the station never waits on it. Every page, script and style
 * comes from the jar. Read-only: GET and HEAD only.
 *
 * <p>Access: with a users file, every request needs an account (HTTP Basic, checked against the
 * PBKDF2 hashes; send it over TLS or a trusted network only); without one (allowed on loopback
 * only) every request is a viewer and the Host header must name the loopback, so a web page
 * elsewhere cannot reach the view through a rebound DNS name.
 *
 * <p>With {@code cert_file} and {@code key_file} in the settings the server speaks HTTPS only,
 * TLS 1.3 or 1.2, with the station's certificate.
 */
public final class WebView implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(WebView.class);
    static final String ROLE = "hammerstep.role";
    private static final String REALM = "hammerstep station";

    private final HttpServer server;
    private final ExecutorService pool;
    private final LiveFeed feed;
    private final Thread feedThread;
    private final Pages pages;
    private final WhatIfPages whatIf;
    private final WebStation files;
    private final Accounts accounts;
    private final boolean open;
    /** The key of this run's cross-site tokens: random at each start, never stored or shown. */
    private final byte[] tokenKey = new byte[32];

    private WebView(HttpServer server, ExecutorService pool, LiveBoard board, Accounts accounts, String station,
                    WebStation files) {
        this.server = server;
        this.pool = pool;
        this.accounts = accounts;
        this.open = accounts == null;
        new java.security.SecureRandom().nextBytes(tokenKey);
        this.feed = new LiveFeed(board);
        this.pages = new Pages(board, station, open);
        this.whatIf = new WhatIfPages(pages, board, files);
        this.files = files;
        this.feedThread = new Thread(feed, "web-live");
        this.feedThread.setDaemon(true);
    }

    /**
     * Starts serving; returns once the port is bound.
     *
     * @param station the station's name for page titles (site/line/station)
     * @throws IOException when the address cannot be bound (in use, not this host's)
     */
    public static WebView start(WebSettings settings, LiveBoard board, String station)
            throws IOException, Accounts.AccountsException {
        return start(settings, board, station, WebStation.none());
    }

    /**
     * Starts serving, with the station's files for the what-if and programs pages; returns once the
     * port is bound.
     */
    public static WebView start(WebSettings settings, LiveBoard board, String station, WebStation files)
            throws IOException, Accounts.AccountsException {
        Accounts accounts = settings.usersFile() == null ? null : Accounts.read(settings.usersFile());
        if (accounts == null && !settings.loopbackOnly()) {
            throw new IllegalArgumentException("an open web view is for loopback only, not " + settings.bind());
        }
        HttpServer server = settings.tls() ? https(settings) : HttpServer.create();
        server.bind(new InetSocketAddress(settings.bind(), settings.port()), 32);
        AtomicInteger n = new AtomicInteger();
        ExecutorService pool = Executors.newFixedThreadPool(4, r -> {
            Thread t = new Thread(r, "web-" + n.incrementAndGet());
            t.setDaemon(true);
            return t;
        });
        WebView view = new WebView(server, pool, board, accounts, station, files);
        var context = server.createContext("/", view::handle);
        context.setAuthenticator(view.new Login());
        server.setExecutor(pool);
        server.start();
        view.feedThread.start();
        return view;
    }

    /** TLS versions the view speaks; older ones are refused at the handshake. */
    static final String[] PROTOCOLS = {"TLSv1.3", "TLSv1.2"};

    private static HttpsServer https(WebSettings settings) throws IOException {
        SSLContext ctx = PemFiles.serverContext(settings.certFile(), settings.keyFile());
        HttpsServer server = HttpsServer.create();
        server.setHttpsConfigurator(new HttpsConfigurator(ctx) {
            @Override
            public void configure(HttpsParameters params) {
                SSLParameters p = ctx.getDefaultSSLParameters();
                p.setProtocols(PROTOCOLS);
                params.setSSLParameters(p);
            }
        });
        return server;
    }

    /** The port served (the one asked for, or the one the system chose for port 0). */
    public int port() {
        return server.getAddress().getPort();
    }

    /** True when the view asks no login (loopback without a users file). */
    public boolean open() {
        return open;
    }

    /** Pages with a live event stream open now. */
    public int livePages() {
        return feed.pages();
    }

    @Override
    public void close() {
        feed.stop();
        feedThread.interrupt();
        whatIf.close();
        server.stop(0);
        pool.shutdownNow();
    }

    /** Checks the account of every request, or the Host header of an open view. */
    private final class Login extends Authenticator {
        private record Known(String user, Role role) { }

        private final Map<String, Known> recent = new java.util.concurrent.ConcurrentHashMap<>();

        @Override
        public Result authenticate(HttpExchange ex) {
            if (open) {
                String host = ex.getRequestHeaders().getFirst("Host");
                if (host == null || !loopbackHost(host)) {
                    return new Failure(421);
                }
                ex.setAttribute(ROLE, Role.VIEWER);
                return new Success(new HttpPrincipal("open", REALM));
            }
            String header = ex.getRequestHeaders().getFirst("Authorization");
            if (header != null && header.regionMatches(true, 0, "Basic ", 0, 6) && header.length() < 1024) {
                Known known = recent.get(header);
                Role role = known == null ? null : known.role();
                String user = known == null ? null : known.user();
                if (role == null) {
                    String decoded;
                    try {
                        decoded = new String(Base64.getDecoder().decode(header.substring(6).strip()),
                                StandardCharsets.UTF_8);
                    } catch (IllegalArgumentException e) {
                        decoded = "";
                    }
                    int colon = decoded.indexOf(':');
                    if (colon > 0) {
                        user = decoded.substring(0, colon);
                        role = accounts.check(user, decoded.substring(colon + 1).toCharArray());
                        if (role != null) {
                            if (recent.size() > 64) {
                                recent.clear();
                            }
                            recent.put(header, new Known(user, role));
                        }
                    }
                }
                if (role != null) {
                    ex.setAttribute(ROLE, role);
                    return new Success(new HttpPrincipal(user == null ? "account" : user, REALM));
                }
            }
            ex.getResponseHeaders().set("WWW-Authenticate", "Basic realm=\"" + REALM + "\", charset=\"UTF-8\"");
            return new Retry(401);
        }
    }

    static boolean loopbackHost(String host) {
        String h = host.strip();
        if (h.startsWith("[")) {
            int end = h.indexOf(']');
            return end > 0 && h.substring(1, end).equals("::1");
        }
        int colon = h.lastIndexOf(':');
        String name = colon >= 0 ? h.substring(0, colon) : h;
        return name.equals("localhost") || name.matches("127\\.[0-9]{1,3}\\.[0-9]{1,3}\\.[0-9]{1,3}");
    }

    private void handle(HttpExchange ex) throws IOException {
        boolean stream = false;
        try {
            String method = ex.getRequestMethod();
            URI uri = ex.getRequestURI();
            String path = uri.getPath();
            boolean post = method.equals("POST");
            if (!method.equals("GET") && !method.equals("HEAD") && !(post && FORMS.contains(path))) {
                ex.getResponseHeaders().set("Allow", FORMS.contains(path) ? "GET, HEAD, POST" : "GET, HEAD");
                send(ex, 405, "text/plain", FORMS.contains(path) ? "GET, HEAD or POST only\n"
                        : "this page is read-only: GET and HEAD only\n");
                return;
            }
            Role role = (Role) ex.getAttribute(ROLE);
            if (path.startsWith("/whatif") && (role == null || !role.covers(Role.ENGINEER))) {
                page(ex, pages.refused("The what-if needs an engineer's account; "
                        + (open ? "this open view is a viewer's." : "yours is a viewer's.")));
                return;
            }
            if (post) {
                post(ex, path);
                return;
            }
            Map<String, String> q = query(uri.getRawQuery());
            switch (path) {
                case "/" -> asset(ex, "live.html", "text/html");
                case "/live.js" -> asset(ex, "live.js", "text/javascript");
                case "/style.css" -> asset(ex, "style.css", "text/css");
                case "/events" -> stream = events(ex);
                case "/results" -> page(ex, pages.results(q));
                case "/results.csv" -> csv(ex, q);
                case "/joint" -> page(ex, pages.joint(q.getOrDefault("id", "")));
                case "/part" -> page(ex, pages.part(q.getOrDefault("serial", "")));
                case "/capability" -> page(ex, pages.capability(q));
                case "/whatif" -> page(ex, whatIf.page(token(ex)));
                case "/programs" -> page(ex, ProgramsPage.of(pages, files));
                case "/whatif/joint" -> page(ex, whatIf.joint(q.getOrDefault("n", "")));
                default -> send(ex, 404, "text/plain", "no such page: " + path + "\n");
            }
        } catch (RuntimeException e) {
            LOG.warn("web view: {} {} failed: {}", ex.getRequestMethod(), ex.getRequestURI().getPath(), e.toString());
            if (ex.getResponseCode() < 0) {
                send(ex, 500, "text/plain", "the view failed on this page; the station goes on\n");
            }
        } finally {
            if (!stream) {
                ex.close();
            }
        }
    }

    /** The name of the hidden field that carries the cross-site token in every form. */
    static final String TOKEN_FIELD = "csrf";

    /**
     * The cross-site token of this request's account: HMAC-SHA256, under a key drawn at the view's
     * start, of the account's name and role. A page of another site can make a browser send a form
     * (with the account's cached login) but cannot read this view's pages, so it cannot know the token.
     */
    String token(HttpExchange ex) {
        String who = ex.getPrincipal() == null ? "" : ex.getPrincipal().getUsername();
        Role role = (Role) ex.getAttribute(ROLE);
        try {
            Mac mac = Mac.getInstance("HmacSHA256");
            mac.init(new SecretKeySpec(tokenKey, "HmacSHA256"));
            byte[] t = mac.doFinal(("csrf\u0000" + who + "\u0000" + (role == null ? "" : role.label()))
                    .getBytes(StandardCharsets.UTF_8));
            return Base64.getUrlEncoder().withoutPadding().encodeToString(t);
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("HmacSHA256 missing from this Java runtime", e);
        }
    }

    /**
     * True when a state-changing request may come from where its Origin (else its Referer) header
     * says: from this view's own address (scheme aside, as TLS may end in front of it). A request
     * with neither header is judged by its token alone.
     */
    static boolean sameOrigin(String host, String origin, String referer) {
        String from = origin != null ? origin : referer;
        if (from == null) {
            return true;
        }
        if (host == null || from.strip().equals("null")) {
            return false;
        }
        try {
            URI u = new URI(from.strip());
            String authority = u.getRawAuthority();
            return authority != null && authority.equalsIgnoreCase(host.strip());
        } catch (java.net.URISyntaxException e) {
            return false;
        }
    }

    /** Paths that take a POST: every one a form protected against cross-site requests. */
    private static final java.util.Set<String> FORMS = java.util.Set.of("/whatif");

    /** A form sent: its body read within {@link WhatIfPages#MAX_FORM_BYTES}, then handed to its page. */
    private void post(HttpExchange ex, String path) throws IOException {
        var h = ex.getRequestHeaders();
        if (!sameOrigin(h.getFirst("Host"), h.getFirst("Origin"), h.getFirst("Referer"))) {
            send(ex, 403, "text/plain", "refused: the form was sent from another site's page\n");
            return;
        }
        String length = ex.getRequestHeaders().getFirst("Content-Length");
        long declared;
        try {
            declared = length == null ? -1 : Long.parseLong(length.strip());
        } catch (NumberFormatException e) {
            declared = -1;
        }
        byte[] body = declared > WhatIfPages.MAX_FORM_BYTES ? new byte[0]
                : ex.getRequestBody().readNBytes(WhatIfPages.MAX_FORM_BYTES + 1);
        if (declared > WhatIfPages.MAX_FORM_BYTES || body.length > WhatIfPages.MAX_FORM_BYTES) {
            // read (and drop) a little more so the browser sees the answer, not a connection reset
            InputStream in = ex.getRequestBody();
            byte[] drop = new byte[8192];
            long left = 4L * WhatIfPages.MAX_FORM_BYTES;
            int n;
            while (left > 0 && (n = in.read(drop, 0, (int) Math.min(drop.length, left))) > 0) {
                left -= n;
            }
            send(ex, 413, "text/plain", "a form of at most " + WhatIfPages.MAX_FORM_BYTES / 1024 + " KiB is taken\n");
            return;
        }
        Map<String, FormBody.Field> form;
        try {
            form = FormBody.parse(ex.getRequestHeaders().getFirst("Content-Type"), body);
        } catch (FormBody.BadForm e) {
            send(ex, 400, "text/plain", e.getMessage() + "\n");
            return;
        }
        FormBody.Field sent = form.get(TOKEN_FIELD);
        if (sent == null || !MessageDigest.isEqual(sent.value(), token(ex).getBytes(StandardCharsets.UTF_8))) {
            send(ex, 403, "text/plain", "refused: the form came without this page's token (a form from another site,"
                    + " or a page from before the station's view restarted: reload the page and send it again)\n");
            return;
        }
        String who = ex.getPrincipal() == null ? "?" : ex.getPrincipal().getUsername();
        page(ex, whatIf.start(form, who, token(ex)));
    }

    /** Waits until the what-if under way (if any) has ended; for tests. */
    public void awaitWhatIf(java.time.Duration timeout) throws Exception {
        whatIf.awaitIdle(timeout.toMillis());
    }

    /** Opens a page's event stream; true when the feed took it (the exchange then stays open). */
    private boolean events(HttpExchange ex) throws IOException {
        headers(ex, "text/event-stream");
        ex.getResponseHeaders().set("Cache-Control", "no-store");
        if (ex.getRequestMethod().equals("HEAD")) {
            ex.sendResponseHeaders(200, -1);
            return false;
        }
        ex.sendResponseHeaders(200, 0);
        OutputStream out = ex.getResponseBody();
        out.write("retry: 2000\n\n".getBytes(StandardCharsets.UTF_8));
        out.flush();
        if (!feed.add(out)) {
            out.write("event: full\ndata: {}\n\n".getBytes(StandardCharsets.UTF_8));
            return false;
        }
        return true; // the exchange stays open: the feed's thread writes to it until the page goes
    }

    private void csv(HttpExchange ex, Map<String, String> q) throws IOException {
        JointFilter filter;
        try {
            filter = JointFilter.of(q);
        } catch (JointFilter.BadQuery e) {
            send(ex, 400, "text/plain", e.getMessage() + "\n");
            return;
        }
        headers(ex, "text/csv");
        ex.getResponseHeaders().set("Content-Disposition", "attachment; filename=\"joints.csv\"");
        if (ex.getRequestMethod().equals("HEAD")) {
            ex.sendResponseHeaders(200, -1);
            return;
        }
        ex.sendResponseHeaders(200, 0);
        try (Writer w = new OutputStreamWriter(ex.getResponseBody(), StandardCharsets.UTF_8)) {
            JointCsv.write(filter.apply(pages.board().log().joints()), w);
        }
    }

    private static void page(HttpExchange ex, Pages.Reply reply) throws IOException {
        if (reply.status() == 303) {
            ex.getResponseHeaders().set("Location", reply.html());
            send(ex, 303, "text/plain", "see " + reply.html() + "\n");
            return;
        }
        send(ex, reply.status(), "text/html", reply.html());
    }

    private void asset(HttpExchange ex, String name, String type) throws IOException {
        try (InputStream in = WebView.class.getResourceAsStream("/hammerstep/web/" + name)) {
            if (in == null) {
                send(ex, 404, "text/plain", "missing from the jar: " + name + "\n");
                return;
            }
            byte[] body = in.readAllBytes();
            if (name.equals("live.html")) {
                body = new String(body, StandardCharsets.UTF_8).replace("{{station}}", Html.esc(pages.station()))
                        .replace("{{access}}", open ? Pages.OPEN_NOTE : "").getBytes(StandardCharsets.UTF_8);
            }
            headers(ex, type);
            write(ex, 200, body);
        }
    }

    private static void send(HttpExchange ex, int status, String type, String text) throws IOException {
        headers(ex, type);
        write(ex, status, text.getBytes(StandardCharsets.UTF_8));
    }

    private static void write(HttpExchange ex, int status, byte[] body) throws IOException {
        if (ex.getRequestMethod().equals("HEAD")) {
            ex.sendResponseHeaders(status, -1);
            return;
        }
        ex.sendResponseHeaders(status, body.length == 0 ? -1 : body.length);
        ex.getResponseBody().write(body);
    }

    private static void headers(HttpExchange ex, String type) {
        var h = ex.getResponseHeaders();
        h.set("Content-Type", type + "; charset=utf-8");
        h.set("X-Content-Type-Options", "nosniff");
        h.set("X-Frame-Options", "DENY");
        // same-origin, not no-referrer: under no-referrer a browser sends "Origin: null" with the view's
        // own form posts, which the cross-site check must refuse (found by the browser tests)
        h.set("Referrer-Policy", "same-origin");
        h.set("Content-Security-Policy", "default-src 'self'; img-src 'self' data:; style-src 'self'; "
                + "script-src 'self'; connect-src 'self'; form-action 'self'; frame-ancestors 'none'");
        if (!type.equals("text/event-stream")) {
            h.set("Cache-Control", "no-cache");
        }
    }

    /** A query string's fields (the first of each name), decoded; at most 32 fields. */
    static Map<String, String> query(String raw) {
        Map<String, String> q = new HashMap<>();
        if (raw == null || raw.isEmpty()) {
            return q;
        }
        String[] parts = raw.split("&", 33);
        for (int i = 0; i < Math.min(parts.length, 32); i++) {
            String p = parts[i];
            int eq = p.indexOf('=');
            String k = eq < 0 ? p : p.substring(0, eq);
            String v = eq < 0 ? "" : p.substring(eq + 1);
            try {
                q.putIfAbsent(URLDecoder.decode(k, StandardCharsets.UTF_8), URLDecoder.decode(v, StandardCharsets.UTF_8));
            } catch (IllegalArgumentException e) {
                // a malformed escape: the field is left out
            }
        }
        return q;
    }
}
