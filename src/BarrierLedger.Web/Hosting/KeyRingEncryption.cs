using System.Security.Cryptography;
using System.Text;
using System.Xml.Linq;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.DataProtection;
using Microsoft.AspNetCore.DataProtection.KeyManagement;
using Microsoft.AspNetCore.DataProtection.XmlEncryption;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Hosting;

/// <summary>
/// The key-encryption key that protects the data-protection key ring (the keys that sign cookies) while it sits in the ledger
/// database, and therefore in every backup of it. It is never stored in the database: it comes from
/// "BarrierLedger:KeyRing:Key" (base64 of 32 bytes, e.g. an environment variable), else from the file named by
/// "BarrierLedger:KeyRing:KeyFile" (default <c>keyring.key</c> in the data folder), which is created with mode 0600 on the
/// first start when it does not exist. Instances that share one database must be given the same key.
/// </summary>
public sealed class KeyEncryptionKey
{
    public const string DefaultFileName = "keyring.key";
    private const int KeyBytes = 32;

    private KeyEncryptionKey(byte[] key, string source)
    {
        Key = key;
        Source = source;
        Id = Convert.ToHexStringLower(SHA256.HashData([.. "BarrierLedger key-encryption key id:"u8, .. key])[..8]);
    }

    /// <summary>The AES-256 key.</summary>
    internal byte[] Key { get; }

    /// <summary>A fingerprint that names the key without revealing it (the first 8 bytes of a SHA-256 over it, in hex).</summary>
    public string Id { get; }

    /// <summary>Where the key came from (a file path, or the configuration key), for messages.</summary>
    public string Source { get; }

    /// <summary>Reads the key from configuration or its file, creating the file (0600) when it does not exist yet.</summary>
    public static KeyEncryptionKey Load(IConfiguration configuration, LedgerOptions ledger)
    {
        if (configuration["BarrierLedger:KeyRing:Key"] is { Length: > 0 } text)
            return new KeyEncryptionKey(Decode(text.Trim(), "BarrierLedger:KeyRing:Key"), "BarrierLedger:KeyRing:Key");
        var path = Path.GetFullPath(configuration["BarrierLedger:KeyRing:KeyFile"] is { Length: > 0 } p ? p : Path.Combine(ledger.ResolvedDataDirectory, DefaultFileName));
        if (!File.Exists(path)) Create(path);
        return new KeyEncryptionKey(Decode(File.ReadAllText(path).Trim(), path), path);
    }

    /// <summary>A fresh random key as the base64 text its file holds.</summary>
    public static string NewKeyText() => Convert.ToBase64String(RandomNumberGenerator.GetBytes(KeyBytes));

    private static void Create(string path)
    {
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        var options = new FileStreamOptions { Mode = FileMode.CreateNew, Access = FileAccess.Write };
        if (!OperatingSystem.IsWindows()) options.UnixCreateMode = UnixFileMode.UserRead | UnixFileMode.UserWrite;
        try
        {
            using var writer = new StreamWriter(path, Encoding.ASCII, options);
            writer.WriteLine(NewKeyText());
        }
        catch (IOException) when (File.Exists(path))
        {
            // Another instance created it a moment ago; read theirs.
        }
    }

    private static byte[] Decode(string text, string source)
    {
        byte[] key;
        try
        {
            key = Convert.FromBase64String(text);
        }
        catch (FormatException)
        {
            throw new InvalidOperationException($"The key-encryption key in {source} is not base64 text.");
        }
        if (key.Length != KeyBytes)
            throw new InvalidOperationException($"The key-encryption key in {source} is {key.Length} bytes; it must be {KeyBytes} bytes (base64 of 32 random bytes).");
        return key;
    }
}

/// <summary>Encrypts each data-protection key with AES-256-GCM under the <see cref="KeyEncryptionKey"/> before it is stored.</summary>
public sealed class KeyRingEncryptor(KeyEncryptionKey kek) : IXmlEncryptor
{
    internal static readonly byte[] AssociatedData = "BarrierLedger data-protection key v1"u8.ToArray();

    public EncryptedXmlInfo Encrypt(XElement plaintextElement)
    {
        ArgumentNullException.ThrowIfNull(plaintextElement);
        var plain = Encoding.UTF8.GetBytes(plaintextElement.ToString(SaveOptions.DisableFormatting));
        var nonce = RandomNumberGenerator.GetBytes(AesGcm.NonceByteSizes.MaxSize);
        var tag = new byte[AesGcm.TagByteSizes.MaxSize];
        var cipher = new byte[plain.Length];
        using (var aes = new AesGcm(kek.Key, tag.Length)) aes.Encrypt(nonce, plain, cipher, tag, AssociatedData);
        CryptographicOperations.ZeroMemory(plain);
        var element = new XElement("encryptedKey",
            new XComment(" AES-256-GCM under the key-encryption key named by kek (not stored in this database) "),
            new XAttribute("kek", kek.Id),
            new XElement("nonce", Convert.ToBase64String(nonce)),
            new XElement("tag", Convert.ToBase64String(tag)),
            new XElement("value", Convert.ToBase64String(cipher)));
        return new EncryptedXmlInfo(element, typeof(KeyRingDecryptor));
    }
}

/// <summary>Decrypts what <see cref="KeyRingEncryptor"/> wrote; a key encrypted under another key-encryption key is refused by name.</summary>
public sealed class KeyRingDecryptor(IServiceProvider services) : IXmlDecryptor
{
    public XElement Decrypt(XElement encryptedElement)
    {
        ArgumentNullException.ThrowIfNull(encryptedElement);
        var kek = services.GetRequiredService<KeyEncryptionKey>();
        var id = (string?)encryptedElement.Attribute("kek");
        if (id != kek.Id)
            throw new CryptographicException($"This data-protection key was encrypted under key-encryption key {id}; this instance has {kek.Id} "
                + $"(from {kek.Source}). Give every instance that shares the database the same key (BarrierLedger:KeyRing:KeyFile or BarrierLedger:KeyRing:Key).");
        var nonce = Convert.FromBase64String((string)encryptedElement.Element("nonce")!);
        var tag = Convert.FromBase64String((string)encryptedElement.Element("tag")!);
        var cipher = Convert.FromBase64String((string)encryptedElement.Element("value")!);
        var plain = new byte[cipher.Length];
        using (var aes = new AesGcm(kek.Key, tag.Length)) aes.Decrypt(nonce, cipher, tag, plain, KeyRingEncryptor.AssociatedData);
        try
        {
            return XElement.Parse(Encoding.UTF8.GetString(plain));
        }
        finally
        {
            CryptographicOperations.ZeroMemory(plain);
        }
    }
}

/// <summary>Data protection with its key ring in the ledger database, encrypted under the <see cref="KeyEncryptionKey"/>.</summary>
public static class KeyRingProtection
{
    private static readonly XName RequiresEncryption = XName.Get("requiresEncryption", "http://schemas.asp.net/2015/03/dataProtection");

    /// <summary>
    /// Keys in the ledger database, so a sign-in cookie issued by one instance is accepted by every other on the same store;
    /// each key encrypted before it is written, so a copy of the database alone cannot sign a cookie.
    /// </summary>
    public static IServiceCollection AddBarrierLedgerDataProtection(this IServiceCollection services, IConfiguration configuration)
    {
        var ledger = new LedgerOptions();
        configuration.GetSection(LedgerOptions.SectionName).Bind(ledger);
        var kek = KeyEncryptionKey.Load(configuration, ledger);
        services.AddSingleton(kek);
        services.AddDataProtection().SetApplicationName("BarrierLedger").PersistKeysToDbContext<LedgerDbContext>();
        services.Configure<KeyManagementOptions>(o => o.XmlEncryptor = new KeyRingEncryptor(kek));
        return services;
    }

    /// <summary>
    /// Removes keys that an earlier version stored unencrypted (they are in every older backup, so they must no longer sign or
    /// open anything; whoever was signed in with them signs in again) and reports keys no instance with this key-encryption key
    /// can read. Runs before the key ring is first loaded.
    /// </summary>
    public static async Task<int> RemoveUnencryptedKeysAsync(IDbContextFactory<LedgerDbContext> factory, KeyEncryptionKey kek, ILogger logger)
    {
        await using var db = await factory.CreateDbContextAsync();
        var removed = 0;
        foreach (var row in await db.DataProtectionKeys.ToListAsync())
        {
            var xml = row.Xml is null ? null : XElement.Parse(row.Xml);
            if (xml is null || xml.Descendants().Any(e => (string?)e.Attribute(RequiresEncryption) == "true"))
            {
                db.DataProtectionKeys.Remove(row);
                removed++;
            }
            else if (xml.Descendants("encryptedKey").Select(e => (string?)e.Attribute("kek")).FirstOrDefault() is { } id && id != kek.Id)
            {
                logger.LogWarning("Data-protection key {Key} was encrypted under key-encryption key {Other}; this instance has {Mine} from {Source}. "
                    + "Instances sharing a database need the same key (BarrierLedger:KeyRing:KeyFile or BarrierLedger:KeyRing:Key); "
                    + "cookies signed with that key are not accepted here.", row.FriendlyName, id, kek.Id, kek.Source);
            }
        }
        if (removed > 0)
        {
            await db.SaveChangesAsync();
            logger.LogWarning("Removed {Count} data-protection key(s) stored unencrypted by an earlier version; everyone signs in again once.", removed);
        }
        return removed;
    }
}
