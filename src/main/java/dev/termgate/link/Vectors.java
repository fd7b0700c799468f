package dev.termgate.link;

/** Small vector arithmetic on float arrays. */
final class Vectors {
    private Vectors() {}

    static void normalize(float[] v) {
        double s = 0;
        for (float x : v) s += x * x;
        if (s == 0) return;
        float inv = (float) (1 / Math.sqrt(s));
        for (int i = 0; i < v.length; i++) v[i] *= inv;
    }

    /** Cosine of two unit vectors. */
    static double dot(float[] a, float[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) s += a[i] * b[i];
        return s;
    }
}
