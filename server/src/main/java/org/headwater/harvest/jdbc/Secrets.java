package org.headwater.harvest.jdbc;

import java.util.regex.Pattern;

/** Keeps credentials out of what a harvest stores, logs and prints: URLs without them, messages scrubbed. */
final class Secrets {
    // user:password@ in the authority, and password-like key=value settings (URL query or H2 ;KEY=VALUE).
    private static final Pattern USER_INFO = Pattern.compile("//[^/@;?]*@");
    private static final Pattern SETTING = Pattern.compile(
            "(?i)([?&;:](?:password|passwd|pwd|pass|secret|token|sslpassword|sslkey|access_?key|secret_?key)=)[^&;]*");

    private Secrets() {
    }

    /** The JDBC URL with user information and password-like settings removed. */
    static String safeUrl(String jdbcUrl) {
        String noUser = USER_INFO.matcher(jdbcUrl).replaceAll("//");
        return SETTING.matcher(noUser).replaceAll("$1***");
    }

    /** A driver's message with the password (if any) and unsafe URLs blanked out. */
    static String scrub(String message, String password, String jdbcUrl) {
        String text = message == null ? "" : message;
        if (password != null && !password.isEmpty()) {
            text = text.replace(password, "***");
        }
        return text.replace(jdbcUrl, safeUrl(jdbcUrl));
    }
}
