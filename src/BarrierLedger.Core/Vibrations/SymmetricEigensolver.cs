using System.Runtime.InteropServices;
using MathNet.Numerics.LinearAlgebra;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// Full eigendecomposition of a dense real symmetric matrix: eigenvalues ascending, eigenvectors orthonormal.
/// The native path calls LAPACK's divide-and-conquer driver <c>dsyevd</c> (Anderson et al., LAPACK Users' Guide, 3rd ed.,
/// SIAM 1999) in Debian's OpenBLAS (<c>libopenblas.so.0</c>), loaded by name at run time; when it is absent the managed
/// MathNet.Numerics <c>Evd</c> (Householder tridiagonalisation + implicit QL) is used. <see cref="NativeAvailable"/> and
/// <see cref="Describe"/> say which one runs.
/// </summary>
public static unsafe class SymmetricEigensolver
{
    /// <summary>Name reported in <see cref="VibrationalAnalysis.EigenSolver"/> for the native path.</summary>
    public const string NativeName = "LAPACK dsyevd (OpenBLAS libopenblas.so.0)";

    /// <summary>Name reported in <see cref="VibrationalAnalysis.EigenSolver"/> for the managed path.</summary>
    public const string ManagedName = "MathNet.Numerics managed Evd";

    private const string LibraryName = "libopenblas.so.0";

    private static readonly Lazy<NativeEntry?> s_native = new(LoadNative);

    private sealed record NativeEntry(nint Dsyevd, nint SetThreads, nint GetThreads);

    /// <summary>True when <c>libopenblas.so.0</c> loaded and exports <c>dsyevd_</c>.</summary>
    public static bool NativeAvailable => s_native.Value is not null;

    /// <summary>The solver <paramref name="choice"/> resolves to on this machine.</summary>
    public static string Describe(EigenSolverChoice choice = EigenSolverChoice.Auto) => choice switch
    {
        EigenSolverChoice.Managed => ManagedName,
        EigenSolverChoice.Native => NativeAvailable ? NativeName : "native LAPACK requested but libopenblas.so.0 is not loadable",
        _ => NativeAvailable ? NativeName : ManagedName,
    };

    /// <summary>
    /// Sets the number of OpenBLAS threads (<c>openblas_set_num_threads</c>) when the native library is loaded and exports it.
    /// Returns false otherwise. Affects the whole process.
    /// </summary>
    public static bool TrySetNativeThreadCount(int threads)
    {
        if (threads < 1) throw new ArgumentException($"Thread count must be at least 1, got {threads}.", nameof(threads));
        if (s_native.Value is not { SetThreads: not 0 } e) return false;
        ((delegate* unmanaged<int, void>)e.SetThreads)(threads);
        return true;
    }

    /// <summary>OpenBLAS thread count (<c>openblas_get_num_threads</c>), or null when not available.</summary>
    public static int? NativeThreadCount =>
        s_native.Value is { GetThreads: not 0 } e ? ((delegate* unmanaged<int>)e.GetThreads)() : null;

    /// <summary>
    /// Diagonalises the symmetric n×n matrix in <paramref name="matrix"/> (row-major; only its lower triangle in column-major
    /// terms, i.e. its upper triangle row-major, is read). On return <paramref name="matrix"/> holds the eigenvectors, eigenvector k
    /// in elements [k·n, k·n + n); the returned array holds the eigenvalues ascending. Returns the solver name used.
    /// </summary>
    public static string Solve(double[] matrix, int n, double[] eigenvalues, EigenSolverChoice choice = EigenSolverChoice.Auto)
    {
        if (n < 0) throw new ArgumentException("Matrix order must not be negative.", nameof(n));
        if (matrix.Length != n * n) throw new ArgumentException($"Expected {n}×{n} = {n * n} elements, got {matrix.Length}.", nameof(matrix));
        if (eigenvalues.Length != n) throw new ArgumentException($"Expected {n} eigenvalue slots, got {eigenvalues.Length}.", nameof(eigenvalues));
        if (n == 0) return Describe(choice);
        var useNative = choice switch
        {
            EigenSolverChoice.Managed => false,
            EigenSolverChoice.Native => NativeAvailable
                ? true
                : throw new InvalidOperationException($"Native LAPACK was requested but {LibraryName} could not be loaded or lacks dsyevd_."),
            _ => NativeAvailable,
        };
        if (useNative)
        {
            SolveNative(s_native.Value!, matrix, n, eigenvalues);
            return NativeName;
        }
        SolveManaged(matrix, n, eigenvalues);
        return ManagedName;
    }

    /// <summary>
    /// As <see cref="Solve"/>, but <paramref name="buffer"/> may be longer than n² (a pooled array); only its first n² elements are used.
    /// </summary>
    internal static string SolveInPlace(double[] buffer, int n, double[] eigenvalues, EigenSolverChoice choice)
    {
        if (buffer.Length == n * n) return Solve(buffer, n, eigenvalues, choice);
        if (buffer.Length < n * n) throw new ArgumentException($"Buffer of {buffer.Length} elements is smaller than {n}².", nameof(buffer));
        if (choice != EigenSolverChoice.Managed && NativeAvailable)
        {
            if (eigenvalues.Length != n) throw new ArgumentException($"Expected {n} eigenvalue slots, got {eigenvalues.Length}.", nameof(eigenvalues));
            if (n > 0) SolveNative(s_native.Value!, buffer, n, eigenvalues);
            return NativeName;
        }
        var exact = buffer.AsSpan(0, n * n).ToArray();
        var name = Solve(exact, n, eigenvalues, choice);
        exact.CopyTo(buffer, 0);
        return name;
    }

    private static void SolveManaged(double[] matrix, int n, double[] eigenvalues)
    {
        // Symmetric, so row-major and column-major storage are the same matrix.
        var m = Matrix<double>.Build.Dense(n, n, matrix);
        var evd = m.Evd(Symmetricity.Symmetric);
        var values = evd.EigenValues.Select(c => c.Real).ToArray();
        var order = Enumerable.Range(0, n).OrderBy(i => values[i]).ToArray();
        var vectors = evd.EigenVectors;
        for (var k = 0; k < n; k++)
        {
            eigenvalues[k] = values[order[k]];
            for (var i = 0; i < n; i++) matrix[k * n + i] = vectors[i, order[k]];
        }
    }

    private static void SolveNative(NativeEntry e, double[] matrix, int n, double[] eigenvalues)
    {
        // Fortran dsyevd_(JOBZ, UPLO, N, A, LDA, W, WORK, LWORK, IWORK, LIWORK, INFO, len(JOBZ), len(UPLO)) on column-major A;
        // for a symmetric matrix the row-major array is the same matrix, and eigenvector k lands in column k = our row k.
        var dsyevd = (delegate* unmanaged<byte*, byte*, int*, double*, int*, double*, double*, int*, int*, int*, int*, nuint, nuint, void>)e.Dsyevd;
        byte jobz = (byte)'V', uplo = (byte)'L';
        int nn = n, lda = n, info = 0;
        double workQuery = 0;
        int iworkQuery = 0, lwork = -1, liwork = -1;
        fixed (double* a = matrix)
        fixed (double* w = eigenvalues)
        {
            dsyevd(&jobz, &uplo, &nn, a, &lda, w, &workQuery, &lwork, &iworkQuery, &liwork, &info, 1, 1);
            if (info != 0) throw new InvalidOperationException($"dsyevd workspace query failed with INFO = {info}.");
            lwork = checked((int)Math.Ceiling(workQuery));
            liwork = iworkQuery;
            var work = (double*)NativeMemory.Alloc((nuint)lwork, sizeof(double));
            var iwork = (int*)NativeMemory.Alloc((nuint)liwork, sizeof(int));
            try
            {
                dsyevd(&jobz, &uplo, &nn, a, &lda, w, work, &lwork, iwork, &liwork, &info, 1, 1);
            }
            finally
            {
                NativeMemory.Free(work);
                NativeMemory.Free(iwork);
            }
        }
        if (info < 0) throw new InvalidOperationException($"dsyevd rejected argument {-info}.");
        if (info > 0) throw new InvalidOperationException($"dsyevd did not converge (INFO = {info}): the matrix may contain huge or non-finite values.");
    }

    private static NativeEntry? LoadNative()
    {
        if (!OperatingSystem.IsLinux() && !OperatingSystem.IsMacOS()) return null;
        if (!NativeLibrary.TryLoad(LibraryName, out var handle)) return null;
        if (!NativeLibrary.TryGetExport(handle, "dsyevd_", out var dsyevd)) return null;
        NativeLibrary.TryGetExport(handle, "openblas_set_num_threads", out var set);
        NativeLibrary.TryGetExport(handle, "openblas_get_num_threads", out var get);
        return new NativeEntry(dsyevd, set, get);
    }
}
