package dev.fray.damage.fracture;

import java.util.List;

/** Least-squares straight line through (x, y) points, for the profile fits of the phase-field tests. */
final class LineFit {
    private LineFit() {
    }

    /**
     * @param pts points as {x, y}
     * @return {intercept, slope} of y = c0 + c1 x
     */
    static double[] of(List<double[]> pts) {
        double mx = 0, my = 0;
        for (double[] q : pts) {
            mx += q[0];
            my += q[1];
        }
        mx /= pts.size();
        my /= pts.size();
        double num = 0, den = 0;
        for (double[] q : pts) {
            num += (q[0] - mx) * (q[1] - my);
            den += (q[0] - mx) * (q[0] - mx);
        }
        double slope = num / den;
        return new double[] {my - slope * mx, slope};
    }
}
