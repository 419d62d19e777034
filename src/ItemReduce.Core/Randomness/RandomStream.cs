namespace ItemReduce.Core.Randomness;

/// <summary>
/// Seeded pseudo-random stream: xoshiro256** (Blackman &amp; Vigna, 2021, "Scrambled linear pseudorandom
/// number generators", ACM Trans. Math. Softw. 47(4), 36), seeded through SplitMix64 (Steele, Lea &amp;
/// Flood, 2014). Every random step in ItemReduce draws from one of these streams; parallel work uses
/// <see cref="ForTask"/> so results do not depend on the number of threads.
/// Not thread-safe: one stream per task.
/// </summary>
public sealed class RandomStream
{
    /// <summary>The seed every seeded step uses unless told otherwise (the one default of the program's seed).</summary>
    public const ulong DefaultSeed = 1;

    private ulong _s0, _s1, _s2, _s3;
    private double _spareGaussian;
    private bool _hasSpare;

    /// <summary>A stream determined entirely by <paramref name="seed"/>.</summary>
    public RandomStream(ulong seed)
    {
        ulong x = seed;
        _s0 = SplitMix64(ref x);
        _s1 = SplitMix64(ref x);
        _s2 = SplitMix64(ref x);
        _s3 = SplitMix64(ref x);
        if ((_s0 | _s1 | _s2 | _s3) == 0) _s0 = 1;
    }

    /// <summary>
    /// An independent stream for task number <paramref name="taskIndex"/> of a run seeded with
    /// <paramref name="seed"/>; the same (seed, task, purpose) always gives the same stream.
    /// </summary>
    public static RandomStream ForTask(ulong seed, long taskIndex, ulong purpose = 0)
    {
        ulong x = seed ^ (0x9E3779B97F4A7C15UL * (purpose + 1));
        ulong a = SplitMix64(ref x);
        ulong y = a ^ ((ulong)taskIndex * 0xD1B54A32D192ED03UL + 0x8CB92BA72F3D8DD7UL);
        return new RandomStream(SplitMix64(ref y));
    }

    private static ulong SplitMix64(ref ulong x)
    {
        ulong z = x += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }

    /// <summary>Next 64 random bits.</summary>
    public ulong NextUInt64() => Step(ref _s0, ref _s1, ref _s2, ref _s3);

    /// <summary>Uniform double in [0, 1) with 53 random bits.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));

    /// <summary>Uniform double in (0, 1): never exactly 0, safe for logarithms.</summary>
    public double NextOpenDouble() => ((NextUInt64() >> 12) + 0.5) * (1.0 / (1UL << 52));

    /// <summary>Uniform integer in [0, <paramref name="bound"/>) without modulo bias (Lemire, 2019).</summary>
    public int NextInt(int bound)
    {
        if (bound <= 0) throw new ArgumentOutOfRangeException(nameof(bound), bound, "bound must be positive");
        ulong m = (ulong)(uint)NextUInt64() * (ulong)bound;
        uint l = (uint)m;
        if (l < (uint)bound)
        {
            uint t = (uint)(-bound) % (uint)bound;
            while (l < t)
            {
                m = (ulong)(uint)NextUInt64() * (ulong)bound;
                l = (uint)m;
            }
        }
        return (int)(m >> 32);
    }

    /// <summary>Standard normal variate (Marsaglia polar method, 1964).</summary>
    public double NextGaussian()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spareGaussian;
        }
        double u, v, s;
        do
        {
            u = 2.0 * NextDouble() - 1.0;
            v = 2.0 * NextDouble() - 1.0;
            s = u * u + v * v;
        } while (s >= 1.0 || s == 0.0);
        double f = Math.Sqrt(-2.0 * Math.Log(s) / s);
        _spareGaussian = v * f;
        _hasSpare = true;
        return u * f;
    }

    /// <summary>Fisher–Yates shuffle of <paramref name="values"/> in place: position i = n − 1, …, 1 swaps with
    /// <c>NextInt(i + 1)</c>. The generator state is kept in locals for the loop (the same draws as calling
    /// <see cref="NextInt"/>, several times faster on long spans).</summary>
    public void Shuffle<T>(Span<T> values)
    {
        ulong s0 = _s0, s1 = _s1, s2 = _s2, s3 = _s3;
        for (int i = values.Length - 1; i > 0; i--)
        {
            uint bound = (uint)i + 1;
            ulong m = (ulong)(uint)Step(ref s0, ref s1, ref s2, ref s3) * bound;
            uint l = (uint)m;
            if (l < bound)
            {
                uint t = (0u - bound) % bound;
                while (l < t)
                {
                    m = (ulong)(uint)Step(ref s0, ref s1, ref s2, ref s3) * bound;
                    l = (uint)m;
                }
            }
            int k = (int)(m >> 32);
            (values[i], values[k]) = (values[k], values[i]);
        }
        _s0 = s0;
        _s1 = s1;
        _s2 = s2;
        _s3 = s3;
    }

    /// <summary>One step of xoshiro256** (<see cref="NextUInt64"/> on the fields, <see cref="Shuffle{T}"/> on locals).</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static ulong Step(ref ulong s0, ref ulong s1, ref ulong s2, ref ulong s3)
    {
        ulong result = ulong.RotateLeft(s1 * 5, 7) * 9;
        ulong t = s1 << 17;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= t;
        s3 = ulong.RotateLeft(s3, 45);
        return result;
    }
}
