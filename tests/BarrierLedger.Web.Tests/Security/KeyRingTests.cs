using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Web.Hosting;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.DataProtection;
using Microsoft.AspNetCore.DataProtection.EntityFrameworkCore;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 8 (the key ring): the keys that sign cookies sit in the ledger database and so in every backup. They are
/// stored encrypted under a key-encryption key kept outside the database, so a backup alone cannot sign or open a cookie.
/// </summary>
public sealed class KeyRingTests
{
    [Fact, System.Runtime.Versioning.UnsupportedOSPlatform("windows")] // Unix file modes
    public async Task Backup_RestoredWithoutTheKeyEncryptionKey_CannotOpenTheSessions_AndWithItAcceptsTheCookiesOfTheFirstInstance()
    {
        var withKey = NewFolder();
        var withoutKey = NewFolder();
        try
        {
            string cookie, keyText;
            var backup = new MemoryStream();
            await using (var a = new ApiTestHost())
            {
                await CookieSession.CreateUserAsync(a, "mira", Roles.Member);
                using var session = await CookieSession.SignInAsync(a, "mira");
                Assert.True(CookieSession.Opens(await session.Http.GetAsync("/")));
                cookie = session.CookieHeader;

                // The key-encryption key: a file of its own, readable by the app's account only.
                var keyFile = Path.Combine(a.DataDirectory, KeyEncryptionKey.DefaultFileName);
                Assert.Equal(UnixFileMode.UserRead | UnixFileMode.UserWrite, File.GetUnixFileMode(keyFile));
                keyText = await File.ReadAllTextAsync(keyFile);

                // What the database (and so the backup) holds: ciphertext under that key, no key material in the clear.
                await using (var db = await a.DbAsync())
                {
                    var keys = await db.DataProtectionKeys.Select(k => k.Xml!).ToListAsync();
                    Assert.NotEmpty(keys);
                    Assert.All(keys, xml =>
                    {
                        Assert.Contains("<encryptedKey", xml);
                        Assert.DoesNotContain("masterKey", xml);
                        Assert.DoesNotContain("requiresEncryption", xml);
                    });
                }
                await new BackupService(a.Get<LedgerOptions>()).CreateArchiveAsync(backup);
            }

            foreach (var folder in new[] { withKey, withoutKey })
            {
                backup.Position = 0;
                await BackupService.RestoreArchiveAsync(backup, folder, new LedgerOptions().DatabaseFileName, force: false);
            }
            await File.WriteAllTextAsync(Path.Combine(withKey, KeyEncryptionKey.DefaultFileName), keyText);

            // Restored elsewhere without the key: the stored keys cannot be decrypted, so the first instance's cookie opens nothing.
            await using (var elsewhere = new ApiTestHost(dataDirectory: withoutKey))
            {
                using var replay = CookieSession.Replay(elsewhere.BaseAddress, cookie);
                Assert.False(CookieSession.Opens(await replay.GetAsync("/")));
                await using var db = await elsewhere.DbAsync();
                var stolen = (await db.DataProtectionKeys.OrderBy(k => k.Id).FirstAsync()).Xml!;
                var decryptor = new KeyRingDecryptor(elsewhere.Services);
                var encrypted = System.Xml.Linq.XElement.Parse(stolen).Descendants("encryptedKey").Single();
                var refused = Assert.ThrowsAny<System.Security.Cryptography.CryptographicException>(() => decryptor.Decrypt(encrypted));
                Assert.Contains("key-encryption key", refused.Message);
            }

            // Restored with the key-encryption key: the same cookie is accepted by the new instance.
            await using (var restored = new ApiTestHost(dataDirectory: withKey))
            {
                using var replay = CookieSession.Replay(restored.BaseAddress, cookie);
                Assert.True(CookieSession.Opens(await replay.GetAsync("/")));
            }
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            foreach (var f in new[] { withKey, withoutKey }) try { Directory.Delete(f, true); } catch (IOException) { }
        }
    }

    [Fact]
    public async Task KeysStoredUnencryptedByAnEarlierVersion_AreRemovedAtStart()
    {
        var folder = NewFolder();
        try
        {
            await using (var first = new ApiTestHost(dataDirectory: folder)) { }

            // A key exactly as data protection writes it without an encryptor (what earlier versions stored).
            var plainFolder = NewFolder();
            var plain = new ServiceCollection();
            plain.AddDataProtection().SetApplicationName("BarrierLedger").PersistKeysToFileSystem(new DirectoryInfo(plainFolder));
            await using (var provider = plain.BuildServiceProvider()) provider.GetDataProtector("any").Protect("x"u8.ToArray());
            var xml = await File.ReadAllTextAsync(Directory.GetFiles(plainFolder, "*.xml").Single());
            Directory.Delete(plainFolder, true);
            Assert.Contains("requiresEncryption", xml); // the key material is in the clear
            var options = new DbContextOptionsBuilder<LedgerDbContext>().UseSqlite($"Data Source={Path.Combine(folder, new LedgerOptions().DatabaseFileName)};Pooling=False").Options;
            await using (var db = new LedgerDbContext(options))
            {
                db.DataProtectionKeys.Add(new DataProtectionKey { FriendlyName = "from an earlier version", Xml = xml });
                await db.SaveChangesAsync();
            }

            await using var again = new ApiTestHost(dataDirectory: folder);
            await using var check = await again.DbAsync();
            var names = await check.DataProtectionKeys.Select(k => k.FriendlyName).ToListAsync();
            Assert.DoesNotContain("from an earlier version", names);
            Assert.All(await check.DataProtectionKeys.Select(k => k.Xml!).ToListAsync(), x => Assert.DoesNotContain("requiresEncryption", x));
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            try { Directory.Delete(folder, true); } catch (IOException) { }
        }
    }

    private static string NewFolder()
    {
        var dir = Path.Combine(Path.GetTempPath(), "bl-keyring-" + Guid.NewGuid().ToString("N")[..10]);
        Directory.CreateDirectory(dir);
        return dir;
    }
}
